import type { Channel } from '../core/channels';
import {
  kpaPer,
  kphPer,
  lambdaFromAfr,
  lambdaFromPhi,
  secondsPer,
  toCelsius,
  type MixtureUnit,
  type PressureUnit,
  type SpeedUnit,
  type TemperatureUnit,
  type TimeUnit,
} from '../units';
import { CHANNEL_UNITS, type ChannelUnit } from './column-mapping';

/** Turns one value in a column's unit into the channel's canonical unit. */
export type ValueConverter = (value: number) => number;

/** The converter of a column already in its channel's canonical unit. */
const keepValue: ValueConverter = (v) => v;

/** The converter that multiplies by `k`; a factor of 1 keeps values as they are, exactly. */
function scaleBy(k: number): ValueConverter {
  return k === 1 ? keepValue : (v) => v * k;
}

/**
 * Whether `convert` (from {@link channelConverter}) leaves every value as it is, so that a loop
 * over millions of cells may skip the call.
 */
export function isIdentityConverter(convert: ValueConverter): boolean {
  return convert === keepValue;
}

/**
 * The converter from `unit` to the canonical unit of `channel` (see `CANONICAL_UNITS`), built
 * from the shared unit factors: psi/bar/inHg → kPa, °F/K → °C, ms → s, mph → km/h, AFR → λ
 * with `stoichAfr`, φ → λ. Boost stays gauge here; the builder adds the barometer. An absent
 * unit means the channel's canonical one.
 */
export function channelConverter(
  channel: Channel,
  unit: ChannelUnit | undefined,
  stoichAfr: number,
): ValueConverter {
  const allowed = CHANNEL_UNITS[channel];
  const u = unit ?? allowed[0];
  if (u !== undefined && !allowed.includes(u)) {
    throw new Error(`channelConverter: unit "${u}" does not fit channel "${channel}"`);
  }
  switch (channel) {
    case 'time':
      return scaleBy(secondsPer(u as TimeUnit));
    case 'map':
    case 'boost':
    case 'baro':
      return scaleBy(kpaPer(u as PressureUnit));
    case 'lambda':
    case 'lambdaTarget':
      return mixtureConverter(u as MixtureUnit, stoichAfr);
    case 'iat':
    case 'ect': {
      const t = u as TemperatureUnit;
      return t === 'C' ? keepValue : (v) => toCelsius(v, t);
    }
    case 'speed':
      return scaleBy(kphPer(u as SpeedUnit));
    default:
      return keepValue;
  }
}

function mixtureConverter(unit: MixtureUnit, stoichAfr: number): ValueConverter {
  switch (unit) {
    case 'lambda':
      return keepValue;
    case 'afr':
      return (v) => lambdaFromAfr(v, stoichAfr);
    case 'phi':
      // φ = 0 would be an infinitely lean mixture: no reading, not a number.
      return (v) => (v === 0 ? NaN : lambdaFromPhi(v));
  }
}

const FLAG_WORDS: ReadonlyMap<string, number> = new Map([
  ['true', 1],
  ['on', 1],
  ['yes', 1],
  ['y', 1],
  ['active', 1],
  ['false', 0],
  ['off', 0],
  ['no', 0],
  ['n', 0],
  ['inactive', 0],
]);

/** A 0/1 flag from a word (`on`, `true`, `yes`…), or NaN when the text is not one. */
export function flagFromWord(text: string): number {
  return FLAG_WORDS.get(text.trim().toLowerCase()) ?? NaN;
}

/** Channels stored as 0/1. */
export const FLAG_CHANNELS: ReadonlySet<Channel> = new Set(['closedLoop', 'fuelCut']);
