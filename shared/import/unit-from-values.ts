import type { Channel } from '../core/channels';
import type { ChannelUnit } from './column-mapping';

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2
    ? (sorted[mid] as number)
    : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

/**
 * The unit a column's values betray when neither header nor name says, or null when they do
 * not tell. Only unambiguous ranges are used: a mixture above 3 is an AFR (lambda and φ stay
 * near 1); a barometer of 25–32 is inHg, 12–16 psi, 0.5–1.1 bar; a MAP below 4 is in bar;
 * a temperature above 200 is in kelvin; a clock stepping ≥ 5 per sample is in milliseconds.
 */
export function unitFromValues(channel: Channel, values: readonly number[]): ChannelUnit | null {
  if (values.length === 0) return null;
  const m = median(values);
  switch (channel) {
    case 'lambda':
    case 'lambdaTarget':
      return m > 3 ? 'afr' : null;
    case 'baro':
      if (m >= 25 && m <= 32) return 'inHg';
      if (m >= 12 && m <= 16) return 'psi';
      if (m >= 0.5 && m <= 1.1) return 'bar';
      if (m >= 50 && m <= 110) return 'kPa';
      return null;
    case 'map':
      return m > 0 && m < 4 ? 'bar' : null;
    case 'iat':
    case 'ect':
      return m > 200 ? 'K' : null;
    case 'time': {
      if (values.length < 3) return null;
      const steps = values.slice(1).map((v, i) => v - (values[i] as number));
      return median(steps) >= 5 ? 'ms' : null;
    }
    default:
      return null;
  }
}
