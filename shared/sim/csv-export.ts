/**
 * CSV text of simulated logs in three naming and unit styles. The headers, delimiters, decimal
 * marks and units are a fixed contract with the import module's tests: change them only
 * together. Lines are produced lazily, so a caller can stream a file of any length without
 * holding it in memory.
 */
import { fromCelsius, fromKpa, KM_PER_MILE } from '../units';
import { type SimSample } from './sim-sample';

/** The CSV styles the simulator writes. */
export const CSV_STYLES = ['snake', 'bracketed', 'unitsrow'] as const;
/** One CSV style. */
export type CsvStyle = (typeof CSV_STYLES)[number];

/** Options of the CSV writers. */
export interface CsvOptions {
  /** Vehicle label for the bracketed style's preamble; default "Simulated vehicle". */
  vehicleLabel?: string;
  /** Start time for the bracketed style's preamble, ISO 8601; default 2024-05-18T09:30:00Z. */
  startedAt?: string;
  /** Stoichiometric AFR for the AFR columns of the bracketed style; default 14.7. */
  stoichAfr?: number;
}

/** Header row of each style (the units row of `unitsrow` is {@link UNITS_ROW}). */
export const CSV_HEADERS: Readonly<Record<CsvStyle, readonly string[]>> = {
  snake: [
    'time_s',
    'engine_rpm',
    'map_kpa',
    'lambda_measured',
    'lambda_target',
    'iat_c',
    'ect_c',
    'throttle_pct',
    'stft_pct',
    'ltft_pct',
    'closed_loop',
    'fuel_cut',
    'gear',
    'vehicle_speed_kph',
    'knock_deg',
    'inj_duty_pct',
  ],
  bracketed: [
    'Time [ms]',
    'Engine Speed [rpm]',
    'Boost [psig]',
    'Barometer [inHg]',
    'Air/Fuel [AFR]',
    'Target Air/Fuel [AFR]',
    'Intake Air Temp [F]',
    'Coolant Temp [F]',
    'Throttle [%]',
    'Short Trim [%]',
    'Long Trim [%]',
    'Loop [CL=1]',
    'Fuel Cut [1=on]',
    'Gear',
    'Speed [mph]',
  ],
  unitsrow: [
    'Time',
    'RPM',
    'MAP',
    'Lambda 1',
    'Cmd Phi',
    'IAT',
    'ECT',
    'TPS',
    'STFT',
    'LTFT',
    'CL',
    'DFCO',
  ],
};

/** The units row of the `unitsrow` style, under its header. */
export const UNITS_ROW: readonly string[] = [
  's',
  'rpm',
  'bar',
  'λ',
  'phi',
  'K',
  '°C',
  '%',
  '%',
  '%',
  '',
  '',
];

/** Field delimiter of each style. */
export const CSV_DELIMITERS: Readonly<Record<CsvStyle, string>> = {
  snake: ',',
  bracketed: ';',
  unitsrow: '\t',
};

const DEFAULT_START = '2024-05-18T09:30:00Z';

/** `value` with `digits` decimals, never "-0.00". */
function fixed(value: number, digits: number): string {
  const text = value.toFixed(digits);
  return text.charCodeAt(0) === 45 && Number(text) === 0 ? text.slice(1) : text;
}

function snakeRow(s: SimSample): string[] {
  return [
    fixed(s.timeS, 3),
    fixed(s.rpm, 0),
    fixed(s.mapKpa, 2),
    fixed(s.lambdaMeasured, 4),
    fixed(s.lambdaTarget, 3),
    fixed(s.iatC, 1),
    fixed(s.ectC, 1),
    fixed(s.tpsPct, 1),
    fixed(s.stftPct, 2),
    fixed(s.ltftPct, 2),
    String(s.closedLoop),
    String(s.fuelCut),
    String(s.gear),
    fixed(s.speedKph, 1),
    fixed(s.knockDeg, 1),
    fixed(s.injDutyPct, 1),
  ];
}

function bracketedRow(s: SimSample, stoichAfr: number): string[] {
  const cells = [
    fixed(Math.round(s.timeS * 1000), 0),
    fixed(s.rpm, 0),
    fixed(fromKpa(s.mapKpa - s.baroKpa, 'psi'), 3),
    fixed(fromKpa(s.baroKpa, 'inHg'), 3),
    fixed(s.lambdaMeasured * stoichAfr, 2),
    fixed(s.lambdaTarget * stoichAfr, 2),
    fixed(fromCelsius(s.iatC, 'F'), 1),
    fixed(fromCelsius(s.ectC, 'F'), 1),
    fixed(s.tpsPct, 1),
    fixed(s.stftPct, 2),
    fixed(s.ltftPct, 2),
    String(s.closedLoop),
    String(s.fuelCut),
    String(s.gear),
    fixed(s.speedKph / KM_PER_MILE, 1),
  ];
  return cells.map((cell) => cell.replace('.', ','));
}

function unitsRowRow(s: SimSample): string[] {
  return [
    fixed(s.timeS, 3),
    fixed(s.rpm, 0),
    fixed(fromKpa(s.mapKpa, 'bar'), 4),
    fixed(s.lambdaMeasured, 4),
    fixed(1 / s.lambdaTarget, 4),
    fixed(fromCelsius(s.iatC, 'K'), 1),
    fixed(s.ectC, 1),
    fixed(s.tpsPct, 1),
    fixed(s.stftPct, 2),
    fixed(s.ltftPct, 2),
    String(s.closedLoop),
    String(s.fuelCut),
  ];
}

/**
 * Yields the lines of a CSV file of `samples` in `style`, each ending in "\n": the preamble and
 * header (and units row) first, then one line per sample as it is drawn from `samples`.
 */
export function* csvLines(
  samples: Iterable<SimSample>,
  style: CsvStyle,
  options: CsvOptions = {},
): Generator<string> {
  if (!CSV_STYLES.includes(style))
    throw new Error(`csvLines: style must be one of ${CSV_STYLES.join(', ')}`);
  const label = options.vehicleLabel ?? 'Simulated vehicle';
  const startedAt = options.startedAt ?? DEFAULT_START;
  if (/[\r\n]/.test(label)) throw new Error('csvLines: options.vehicleLabel must be one line');
  if (Number.isNaN(Date.parse(startedAt)))
    throw new Error('csvLines: options.startedAt must be an ISO date');
  const stoichAfr = options.stoichAfr ?? 14.7;
  if (!(stoichAfr > 0)) throw new Error('csvLines: options.stoichAfr must be greater than 0');
  const delimiter = CSV_DELIMITERS[style];
  if (style === 'bracketed') {
    yield 'Cellsmith simulator export\n';
    yield `Vehicle: ${label}\n`;
    yield `Started: ${startedAt}\n`;
  }
  yield CSV_HEADERS[style].join(delimiter) + '\n';
  if (style === 'unitsrow') yield UNITS_ROW.join(delimiter) + '\n';
  for (const sample of samples) {
    const cells =
      style === 'snake'
        ? snakeRow(sample)
        : style === 'bracketed'
          ? bracketedRow(sample, stoichAfr)
          : unitsRowRow(sample);
    yield cells.join(delimiter) + '\n';
  }
}

/** Yields the same text as {@link csvLines} in chunks of `rowsPerChunk` lines (default 4096). */
export function* csvChunks(
  samples: Iterable<SimSample>,
  style: CsvStyle,
  options: CsvOptions & { rowsPerChunk?: number } = {},
): Generator<string> {
  const rowsPerChunk = options.rowsPerChunk ?? 4096;
  if (!Number.isInteger(rowsPerChunk) || rowsPerChunk < 1) {
    throw new Error('csvChunks: options.rowsPerChunk must be a positive integer');
  }
  let chunk: string[] = [];
  for (const line of csvLines(samples, style, options)) {
    chunk.push(line);
    if (chunk.length >= rowsPerChunk) {
      yield chunk.join('');
      chunk = [];
    }
  }
  if (chunk.length > 0) yield chunk.join('');
}

/** The whole CSV text at once (for small logs and tests). */
export function csvText(
  samples: Iterable<SimSample>,
  style: CsvStyle,
  options: CsvOptions = {},
): string {
  return [...csvChunks(samples, style, options)].join('');
}
