/**
 * One sample of a simulated log: the channels a logger records, in canonical units, plus the
 * hidden truth behind them for tests.
 */
import { type Channel } from '../core/channels';

/** The hidden truth behind a sample, which no real log contains. */
export interface SampleTruth {
  /** Lambda leaving the cylinders now (before delay, lag and noise); +∞ on fuel cut. */
  readonly lambdaExhaust: number;
  /** True VE at this speed and MAP, percent. */
  readonly trueVePct: number;
  /** VE the ECU looked up (bilinear in its table), percent. */
  readonly ecuVePct: number;
  /** Manifold pressure without sensor noise, kPa. */
  readonly mapKpa: number;
  /** Air mass flow, g/s. */
  readonly airGps: number;
  /** Extra fuel factor from warm-up and tip-in enrichment (1 = none). */
  readonly enrichment: number;
}

/** One logged sample, canonical units. */
export interface SimSample {
  /** Time since the start, s. */
  readonly timeS: number;
  /** Engine speed, rpm. */
  readonly rpm: number;
  /** Manifold pressure, kPa absolute. */
  readonly mapKpa: number;
  /** Barometric pressure, kPa absolute. */
  readonly baroKpa: number;
  /** Wideband reading, lambda. */
  readonly lambdaMeasured: number;
  /** Commanded lambda. */
  readonly lambdaTarget: number;
  /** Intake air temperature, °C. */
  readonly iatC: number;
  /** Coolant temperature, °C. */
  readonly ectC: number;
  /** Throttle, %. */
  readonly tpsPct: number;
  /** Short-term fuel trim, % (positive: adding fuel). */
  readonly stftPct: number;
  /** Long-term fuel trim, %. */
  readonly ltftPct: number;
  /** 1 while the mixture loop is closed. */
  readonly closedLoop: 0 | 1;
  /** 1 while fuel is cut. */
  readonly fuelCut: 0 | 1;
  /** Engaged gear, 1-based; 0 with the clutch open or in neutral. */
  readonly gear: number;
  /** Vehicle speed, km/h. */
  readonly speedKph: number;
  /** Ignition retard from knock, degrees. */
  readonly knockDeg: number;
  /** Injector duty, %. */
  readonly injDutyPct: number;
  /** What really happened. */
  readonly truth: SampleTruth;
}

/** Which canonical channel each logged field fills. */
export const SAMPLE_CHANNELS: readonly (readonly [Channel, Exclude<keyof SimSample, 'truth'>])[] = [
  ['time', 'timeS'],
  ['rpm', 'rpm'],
  ['map', 'mapKpa'],
  ['baro', 'baroKpa'],
  ['lambda', 'lambdaMeasured'],
  ['lambdaTarget', 'lambdaTarget'],
  ['iat', 'iatC'],
  ['ect', 'ectC'],
  ['tps', 'tpsPct'],
  ['stft', 'stftPct'],
  ['ltft', 'ltftPct'],
  ['closedLoop', 'closedLoop'],
  ['fuelCut', 'fuelCut'],
  ['gear', 'gear'],
  ['speed', 'speedKph'],
  ['knock', 'knockDeg'],
  ['injDuty', 'injDutyPct'],
];

/** Collects samples into a `ColumnarLog` in canonical units (one Float64Array per channel). */
export function samplesToLog(samples: Iterable<SimSample>): {
  length: number;
  channels: Partial<Record<Channel, Float64Array>>;
} {
  const columns = SAMPLE_CHANNELS.map(() => [] as number[]);
  let length = 0;
  for (const sample of samples) {
    SAMPLE_CHANNELS.forEach(([, field], k) => (columns[k] as number[]).push(sample[field]));
    length++;
  }
  const channels: Partial<Record<Channel, Float64Array>> = {};
  SAMPLE_CHANNELS.forEach(
    ([channel], k) => (channels[channel] = Float64Array.from(columns[k] as number[])),
  );
  return { length, channels };
}
