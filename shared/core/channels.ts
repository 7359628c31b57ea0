/**
 * The canonical channels of a log, each in one canonical unit. Import converts every column to
 * these; the rest of the pipeline only ever sees canonical units.
 */
export const CHANNELS = [
  'time', // s
  'rpm', // rev/min
  'map', // kPa absolute
  'boost', // kPa gauge (import only: folded into map with baro)
  'baro', // kPa absolute
  'lambda', // measured lambda (dimensionless)
  'lambdaTarget', // commanded lambda (dimensionless)
  'iat', // °C
  'ect', // °C
  'tps', // %
  'stft', // % (positive: the ECU adds fuel)
  'ltft', // %
  'gear', // 1-based gear number
  'speed', // km/h
  'closedLoop', // 0/1
  'fuelCut', // 0/1
  'knock', // degrees of retard
  'injDuty', // %
] as const;

/** One canonical channel. */
export type Channel = (typeof CHANNELS)[number];

/** The canonical unit each channel is stored in, for display and error messages. */
export const CANONICAL_UNITS: Readonly<Record<Channel, string>> = {
  time: 's',
  rpm: 'rpm',
  map: 'kPa',
  boost: 'kPa',
  baro: 'kPa',
  lambda: 'lambda',
  lambdaTarget: 'lambda',
  iat: 'C',
  ect: 'C',
  tps: '%',
  stft: '%',
  ltft: '%',
  gear: '',
  speed: 'kph',
  closedLoop: '',
  fuelCut: '',
  knock: 'deg',
  injDuty: '%',
};

/** Channels a log must have to be analysed (`map` may come from `boost` + `baro`). */
export const REQUIRED_CHANNELS: readonly Channel[] = [
  'time',
  'rpm',
  'map',
  'lambda',
  'lambdaTarget',
];

/**
 * A log in columnar form: one Float64Array per channel present, all of `length` samples, in
 * canonical units, time ascending. A missing value inside a present channel is NaN.
 */
export interface ColumnarLog {
  /** Number of samples. */
  readonly length: number;
  /** The channels present. */
  readonly channels: Readonly<Partial<Record<Channel, Float64Array>>>;
}

/** Returns a channel of a log or throws naming it, for channels a step cannot work without. */
export function requireChannel(log: ColumnarLog, channel: Channel): Float64Array {
  const data = log.channels[channel];
  if (!data) throw new Error(`the log has no "${channel}" channel`);
  if (data.length !== log.length) {
    throw new Error(`channel "${channel}" has ${data.length} samples, the log ${log.length}`);
  }
  return data;
}
