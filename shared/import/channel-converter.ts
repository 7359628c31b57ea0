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
    case 'time': {
      const k = secondsPer(u as TimeUnit);
      return (v) => v * k;
    }
    case 'map':
    case 'boost':
    case 'baro': {
      const k = kpaPer(u as PressureUnit);
      return (v) => v * k;
    }
    case 'lambda':
    case 'lambdaTarget':
      return mixtureConverter(u as MixtureUnit, stoichAfr);
    case 'iat':
    case 'ect': {
      const t = u as TemperatureUnit;
      return (v) => toCelsius(v, t);
    }
    case 'speed': {
      const k = kphPer(u as SpeedUnit);
      return (v) => v * k;
    }
    default:
      return (v) => v;
  }
}

function mixtureConverter(unit: MixtureUnit, stoichAfr: number): ValueConverter {
  switch (unit) {
    case 'lambda':
      return (v) => v;
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
