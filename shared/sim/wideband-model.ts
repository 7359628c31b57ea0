/**
 * The wideband lambda sensor as the log sees it: exhaust transport delay τ = τ₀ + K/ṁ_air
 * (reference.md §6, simplified model), a first-order sensor lag (UEGO time constant 50–100 ms:
 * Regitz & Collings 2008, abstract), measurement noise, and the sensor's range: on fuel cut
 * the sensor sees fresh air and pins at its lean limit. That limit is the ceiling the controller
 * reports, and controllers differ (λ 1.6 on some, about 1.36 on others), so it is a setting.
 */
import { type SeededRandom } from './seeded-random';

/** Settings of the wideband model. */
export interface WidebandOptions {
  /** Fixed part of the delay (sensor and logging latency), s; default 0.1. */
  fixedDelayS?: number;
  /** Flow part of the delay: K in τ = τ₀ + K/ṁ, g (g/s · s); default 1.0. */
  flowDelayG?: number;
  /** Sensor time constant, s; default 0.075. */
  timeConstantS?: number;
  /** Standard deviation of the noise relative to the reading; default 0.004. */
  noiseRel?: number;
  /** Richest reading, lambda; default 0.6. */
  minLambda?: number;
  /**
   * Leanest reading (fresh air): the ceiling the controller reports on fuel cut, lambda; default
   * 1.6. Controllers differ; 1.25–1.6 is the range worth testing.
   */
  maxLambda?: number;
}

/** The longest delay the model keeps history for, s. */
const MAX_DELAY_S = 1.5;

/** Transport delay in s for an air mass flow in g/s: τ₀ + K/ṁ, with ṁ floored at 1 g/s. */
export function transportDelayS(airGps: number, fixedDelayS = 0.1, flowDelayG = 1.0): number {
  return Math.min(MAX_DELAY_S, fixedDelayS + flowDelayG / Math.max(airGps, 1));
}

/** A stateful wideband; `read` takes the lambda leaving the cylinders now and returns the log's. */
export interface SimWideband {
  /** Advances to `timeS` (fixed step `dtS`) and returns the sensor's reading. */
  read(timeS: number, dtS: number, exhaustLambda: number, airGps: number): number;
}

/** Creates a wideband with the given settings and noise source. */
export function createSimWideband(options: WidebandOptions, random: SeededRandom): SimWideband {
  const fixedDelayS = options.fixedDelayS ?? 0.1;
  const flowDelayG = options.flowDelayG ?? 1.0;
  const timeConstantS = options.timeConstantS ?? 0.075;
  const noiseRel = options.noiseRel ?? 0.004;
  const minLambda = options.minLambda ?? 0.6;
  const maxLambda = options.maxLambda ?? 1.6;
  if (!(minLambda > 0) || !(maxLambda > minLambda) || !Number.isFinite(maxLambda)) {
    throw new Error('createSimWideband: need 0 < minLambda < maxLambda, both finite');
  }
  // A ring buffer of the exhaust lambda history, long enough for the largest delay.
  let capacity = 0;
  let history = new Float64Array(0);
  let count = 0;
  let head = 0;
  let filtered = Number.NaN;
  let startS = 0;
  return {
    read(timeS, dtS, exhaustLambda, airGps) {
      if (capacity === 0) {
        capacity = Math.ceil(MAX_DELAY_S / dtS) + 3;
        history = new Float64Array(capacity);
        startS = timeS;
      }
      const clipped = Math.min(maxLambda, Math.max(minLambda, exhaustLambda));
      history[head] = clipped;
      head = (head + 1) % capacity;
      count = Math.min(count + 1, capacity);
      // The gas reaching the sensor now left the cylinder τ ago; interpolate between samples.
      const delay = Math.min(transportDelayS(airGps, fixedDelayS, flowDelayG), timeS - startS);
      const back = delay / dtS;
      const whole = Math.floor(back);
      const frac = back - whole;
      const at = (k: number): number => {
        const steps = Math.min(k, count - 1);
        return history[(head - 1 - steps + 2 * capacity) % capacity] as number;
      };
      const delayed = (1 - frac) * at(whole) + frac * at(whole + 1);
      filtered = Number.isNaN(filtered)
        ? delayed
        : filtered + (1 - Math.exp(-dtS / timeConstantS)) * (delayed - filtered);
      const noisy = filtered * (1 + noiseRel * random.normal());
      return Math.min(maxLambda, Math.max(minLambda, noisy));
    },
  };
}
