import { CHANNELS } from '../core/channels';
import { CHANNEL_PATTERNS, normaliseColumnName } from './channel-patterns';

describe('normaliseColumnName', () => {
  it.each([
    ['Intake Air Temp [F]', 'intake air temp'],
    ['Boost (psig)', 'boost'],
    ['map_kpa', 'map kpa'],
    ['Air/Fuel [AFR]', 'air fuel'],
    ['engineRpm', 'engine rpm'],
    ['MAP_kPa', 'map kpa'],
    ['Baro_inHg', 'baro inhg'],
    ['Cmd φ', 'cmd phi'],
    ['λ 1', 'lambda 1'],
    ['  Lambda 1  ', 'lambda 1'],
  ])('%s → %s', (name, expected) => {
    expect(normaliseColumnName(name)).toBe(expected);
  });
});

describe('CHANNEL_PATTERNS', () => {
  it('When the table is read, then every canonical channel has at least one pattern', () => {
    const covered = new Set(CHANNEL_PATTERNS.map((p) => p.channel));
    expect(CHANNELS.filter((c) => !covered.has(c))).toEqual([]);
  });

  it('When strengths are read, then each lies in (0, 1]', () => {
    for (const p of CHANNEL_PATTERNS) {
      expect(p.strength).toBeGreaterThan(0);
      expect(p.strength).toBeLessThanOrEqual(1);
    }
  });
});
