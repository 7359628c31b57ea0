import { KM_PER_MILE, fromCelsius, fromKpa, phiFromLambda, afrFromLambda } from '../units';

/** The three CSV styles the project's own simulator writes (the contract with the importer). */
export const EXAMPLE_STYLES = ['snake', 'bracketed', 'unitsrow'] as const;
/** One example style. */
export type ExampleStyle = (typeof EXAMPLE_STYLES)[number];

/** One sample in canonical units, as the examples write it. */
export interface ExampleSample {
  /** Time, s. */
  readonly timeS: number;
  /** Engine speed, rpm. */
  readonly rpm: number;
  /** MAP, kPa absolute. */
  readonly mapKpa: number;
  /** Measured lambda. */
  readonly lambda: number;
  /** Commanded lambda. */
  readonly lambdaTarget: number;
  /** Intake air temperature, °C. */
  readonly iatC: number;
  /** Coolant temperature, °C. */
  readonly ectC: number;
  /** Throttle, %. */
  readonly tps: number;
  /** Short-term fuel trim, %. */
  readonly stft: number;
  /** Long-term fuel trim, %. */
  readonly ltft: number;
  /** Whether fuelling is closed loop (1) or not (0). */
  readonly closedLoop: 0 | 1;
  /** Whether fuel is cut (1) or not (0). */
  readonly fuelCut: 0 | 1;
  /** Gear, 1-based. */
  readonly gear: number;
  /** Vehicle speed, km/h. */
  readonly speedKph: number;
  /** Knock retard, degrees. */
  readonly knockDeg: number;
  /** Injector duty, %. */
  readonly injDuty: number;
}

/** The header line of each style, exactly as agreed with the simulator. */
export const EXAMPLE_HEADERS: Readonly<Record<ExampleStyle, string>> = {
  snake:
    'time_s,engine_rpm,map_kpa,lambda_measured,lambda_target,iat_c,ect_c,throttle_pct,stft_pct,' +
    'ltft_pct,closed_loop,fuel_cut,gear,vehicle_speed_kph,knock_deg,inj_duty_pct',
  bracketed:
    'Time [ms];Engine Speed [rpm];Boost [psig];Barometer [inHg];Air/Fuel [AFR];' +
    'Target Air/Fuel [AFR];Intake Air Temp [F];Coolant Temp [F];Throttle [%];Short Trim [%];' +
    'Long Trim [%];Loop [CL=1];Fuel Cut [1=on];Gear;Speed [mph]',
  unitsrow: 'Time\tRPM\tMAP\tLambda 1\tCmd Phi\tIAT\tECT\tTPS\tSTFT\tLTFT\tCL\tDFCO',
};

/** Options of {@link exampleCsv}. */
export interface ExampleCsvOptions {
  /** Stoichiometric AFR the bracketed style's AFR columns are written with (default 14.7). */
  readonly stoichAfr?: number;
  /** Barometric pressure (kPa) the bracketed style's gauge boost is relative to (101.325). */
  readonly baroKpa?: number;
  /** Line break (default `\n`). */
  readonly newline?: string;
}

function fixed(value: number, digits: number, decimal: '.' | ','): string {
  const text = value.toFixed(digits);
  return decimal === ',' ? text.replace('.', ',') : text;
}

function rowFor(style: ExampleStyle, s: ExampleSample, stoichAfr: number, baroKpa: number): string {
  switch (style) {
    case 'snake':
      return [
        fixed(s.timeS, 3, '.'),
        fixed(s.rpm, 0, '.'),
        fixed(s.mapKpa, 2, '.'),
        fixed(s.lambda, 4, '.'),
        fixed(s.lambdaTarget, 4, '.'),
        fixed(s.iatC, 1, '.'),
        fixed(s.ectC, 1, '.'),
        fixed(s.tps, 1, '.'),
        fixed(s.stft, 2, '.'),
        fixed(s.ltft, 2, '.'),
        s.closedLoop,
        s.fuelCut,
        s.gear,
        fixed(s.speedKph, 1, '.'),
        fixed(s.knockDeg, 1, '.'),
        fixed(s.injDuty, 1, '.'),
      ].join(',');
    case 'bracketed':
      return [
        fixed(s.timeS * 1000, 0, ','),
        fixed(s.rpm, 0, ','),
        fixed(fromKpa(s.mapKpa - baroKpa, 'psi'), 4, ','),
        fixed(fromKpa(baroKpa, 'inHg'), 4, ','),
        fixed(afrFromLambda(s.lambda, stoichAfr), 4, ','),
        fixed(afrFromLambda(s.lambdaTarget, stoichAfr), 4, ','),
        fixed(fromCelsius(s.iatC, 'F'), 2, ','),
        fixed(fromCelsius(s.ectC, 'F'), 2, ','),
        fixed(s.tps, 1, ','),
        fixed(s.stft, 2, ','),
        fixed(s.ltft, 2, ','),
        s.closedLoop,
        s.fuelCut,
        s.gear,
        fixed(s.speedKph / KM_PER_MILE, 3, ','),
      ].join(';');
    case 'unitsrow':
      return [
        fixed(s.timeS, 3, '.'),
        fixed(s.rpm, 0, '.'),
        fixed(fromKpa(s.mapKpa, 'bar'), 5, '.'),
        fixed(s.lambda, 4, '.'),
        fixed(phiFromLambda(s.lambdaTarget), 5, '.'),
        fixed(fromCelsius(s.iatC, 'K'), 2, '.'),
        fixed(s.ectC, 1, '.'),
        fixed(s.tps, 1, '.'),
        fixed(s.stft, 2, '.'),
        fixed(s.ltft, 2, '.'),
        s.closedLoop,
        s.fuelCut,
      ].join('\t');
  }
}

/**
 * A CSV text in one of the simulator's three styles, for tests and demos: `snake` (comma, no
 * preamble), `bracketed` (semicolon, decimal comma, three preamble lines, units in brackets)
 * and `unitsrow` (tab, a units row under the header).
 */
export function exampleCsv(
  style: ExampleStyle,
  samples: readonly ExampleSample[],
  options: ExampleCsvOptions = {},
): string {
  const { stoichAfr = 14.7, baroKpa = 101.325, newline = '\n' } = options;
  const lines: string[] = [];
  if (style === 'bracketed') {
    lines.push(
      'Cellsmith simulator export',
      'Vehicle: Demo coupe',
      'Started: 2024-05-04T09:30:00Z',
    );
  }
  lines.push(EXAMPLE_HEADERS[style]);
  if (style === 'unitsrow') lines.push('s\trpm\tbar\tλ\tphi\tK\t°C\t%\t%\t%\t\t');
  for (const sample of samples) lines.push(rowFor(style, sample, stoichAfr, baroKpa));
  return lines.join(newline) + newline;
}
