import { requireChannel, type ColumnarLog } from '../core/channels';
import { airMassFlowGps } from '../physics';

/**
 * Where the airflow behind the delay comes from: a per-sample series the caller computed (for
 * instance from the VE table the ECU ran), or the engine's displacement and one nominal VE for a
 * rough speed-density estimate from the log's rpm, MAP and IAT.
 */
export interface AirflowSource {
  /** Airflow per sample, g/s; used as given when present. */
  readonly airflowGps?: Float64Array;
  /** Engine displacement, litres; used with `nominalVe` when `airflowGps` is absent. */
  readonly displacementL?: number;
  /** One VE for the whole log, as a fraction. Default 0.8 (part load, reference.md §1 [P]). */
  readonly nominalVe?: number;
  /** Intake temperature used where the log has no `iat` channel, °C. Default 25. */
  readonly defaultIatC?: number;
}

/**
 * Airflow per sample of `log`, g/s, from `source` (see {@link AirflowSource}). The estimate
 * uses `airMassFlowGps` of shared/physics sample by sample; a sample with a NaN, zero or
 * negative rpm or MAP gets NaN. A single nominal VE is off by ±30 % across the map, which moves
 * the flow part of the delay by the same fraction: good enough to align, and the estimate from
 * the log itself absorbs a constant error into K.
 */
export function logAirflowGps(
  log: ColumnarLog,
  source: AirflowSource,
  caller = 'logAirflowGps',
): Float64Array {
  const { airflowGps, displacementL, nominalVe = 0.8, defaultIatC = 25 } = source;
  if (airflowGps) {
    if (airflowGps.length !== log.length) {
      throw new Error(
        `${caller}: airflowGps has ${airflowGps.length} samples, the log ${log.length}`,
      );
    }
    return airflowGps;
  }
  if (displacementL === undefined) {
    throw new Error(`${caller}: give airflowGps, or displacementL to estimate the airflow`);
  }
  if (!(displacementL > 0) || !Number.isFinite(displacementL)) {
    throw new Error(`${caller}: displacementL must be a positive number of litres`);
  }
  if (!(nominalVe > 0) || !(nominalVe <= 2)) {
    throw new Error(`${caller}: nominalVe must be a fraction in (0, 2]`);
  }
  if (!Number.isFinite(defaultIatC)) throw new Error(`${caller}: defaultIatC must be finite`);
  const rpm = requireChannel(log, 'rpm');
  const map = requireChannel(log, 'map');
  const iat = log.channels.iat;
  const out = new Float64Array(log.length);
  for (let i = 0; i < log.length; i++) {
    const iatC = iat && Number.isFinite(iat[i]) ? iat[i] : defaultIatC;
    out[i] =
      rpm[i] > 0 && map[i] > 0 && iatC > -273.15
        ? airMassFlowGps(nominalVe, map[i], iatC, displacementL, rpm[i])
        : NaN;
  }
  return out;
}
