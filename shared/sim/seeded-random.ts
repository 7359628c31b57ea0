/**
 * A small seeded pseudo-random source for the simulator: mulberry32 for uniforms and the
 * Box–Muller transform for normal deviates. The simulator never uses Math.random, so the same
 * seed always gives the same log, byte for byte.
 */

/** A seeded random source. Each call advances its own private state. */
export interface SeededRandom {
  /** A uniform deviate in [0, 1). */
  next(): number;
  /** A uniform deviate in [low, high). */
  between(low: number, high: number): number;
  /** A standard normal deviate (mean 0, standard deviation 1). */
  normal(): number;
}

/**
 * A random source seeded by `seed` (any finite number; it is reduced to 32 bits). mulberry32
 * passes the common statistical batteries for simulation use and needs one 32-bit word of state.
 */
export function createSeededRandom(seed: number): SeededRandom {
  if (!Number.isFinite(seed)) throw new Error('createSeededRandom: seed must be a finite number');
  let state = Math.trunc(seed) >>> 0;
  let spare: number | null = null;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    between: (low, high) => low + (high - low) * next(),
    normal: () => {
      if (spare !== null) {
        const value = spare;
        spare = null;
        return value;
      }
      // 1 − u keeps the logarithm's argument in (0, 1].
      const radius = Math.sqrt(-2 * Math.log(1 - next()));
      const angle = 2 * Math.PI * next();
      spare = radius * Math.sin(angle);
      return radius * Math.cos(angle);
    },
  };
}

/** A slowly wandering disturbance (an Ornstein–Uhlenbeck process) with a given spread. */
export interface Wander {
  /** Advances `dtS` seconds and returns the new value. */
  step(dtS: number): number;
}

/**
 * A zero-mean wander whose value has standard deviation `sigma` and decorrelates over
 * `timeConstantS`. Unlike white noise its rate of change stays small at any sample rate, as a
 * real operator's hand or a dyno's speed control does.
 */
export function createWander(random: SeededRandom, timeConstantS: number, sigma: number): Wander {
  let value = 0;
  return {
    step(dtS) {
      const decay = Math.exp(-dtS / timeConstantS);
      value = value * decay + sigma * Math.sqrt(1 - decay * decay) * random.normal();
      return value;
    },
  };
}
