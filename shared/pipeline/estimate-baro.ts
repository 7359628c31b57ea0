import type { ColumnarLog } from '../core/channels';
import { STANDARD_BARO_KPA } from '../correct/load-guard';

/** The barometric pressure behind the logs, and how it was found. */
export interface BaroEstimate {
  /** Barometric pressure, kPa absolute. */
  readonly kpa: number;
  /**
   * `logged`: the median of the logs' barometer channel; `engine_off`: the median MAP while the
   * engine stood still (MAP then reads the ambient pressure); `assumed`: the standard atmosphere,
   * because the logs hold neither.
   */
  readonly source: 'logged' | 'engine_off' | 'assumed';
}

/** Plausible ambient pressures, kPa: about 9 km up to a deep low at sea level. */
const BARO_RANGE_KPA = [30, 120] as const;
/** Engine speed below which the engine counts as standing still, rpm. */
const ENGINE_OFF_RPM = 50;
/** Readings needed before a median is believed. */
const MIN_READINGS = 20;
/** Largest number of readings the median is taken over (evenly thinned). */
const MAX_READINGS = 20_000;

function median(values: number[]): number {
  values.sort((a, b) => a - b);
  const mid = values.length >> 1;
  return values.length % 2 === 1
    ? (values[mid] as number)
    : ((values[mid - 1] as number) + (values[mid] as number)) / 2;
}

/** Plausible readings of `pick(i)` over every log, thinned evenly to at most MAX_READINGS. */
function readings(
  logs: readonly ColumnarLog[],
  pick: (log: ColumnarLog, i: number) => number,
): number[] {
  const total = logs.reduce((n, log) => n + log.length, 0);
  const stride = Math.max(1, Math.ceil(total / MAX_READINGS));
  const out: number[] = [];
  for (const log of logs) {
    for (let i = 0; i < log.length; i += stride) {
      const v = pick(log, i);
      if (v >= BARO_RANGE_KPA[0] && v <= BARO_RANGE_KPA[1]) out.push(v);
    }
  }
  return out;
}

/**
 * The barometric pressure the logs were recorded at: the median of a barometer channel, else the
 * median MAP while the engine stood still, else the standard atmosphere (101.325 kPa). The load
 * line of the fuel-safety guard is a share of it, so a car tuned at altitude has its line where
 * its wide-open throttle really is.
 */
export function estimateBaro(logs: readonly ColumnarLog[]): BaroEstimate {
  const logged = readings(logs, (log, i) => log.channels.baro?.[i] ?? NaN);
  if (logged.length >= MIN_READINGS) return { kpa: median(logged), source: 'logged' };
  const stillMap = readings(logs, (log, i) => {
    const rpm = log.channels.rpm?.[i] ?? NaN;
    return rpm >= 0 && rpm < ENGINE_OFF_RPM ? (log.channels.map?.[i] ?? NaN) : NaN;
  });
  if (stillMap.length >= MIN_READINGS) return { kpa: median(stillMap), source: 'engine_off' };
  return { kpa: STANDARD_BARO_KPA, source: 'assumed' };
}
