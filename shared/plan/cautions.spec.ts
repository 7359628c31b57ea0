import { cautionsFor } from './cautions';

describe('cautionsFor', () => {
  it('When a road plan, then it asks to obey the law, prefer a dyno for full load, and a passenger', () => {
    const text = cautionsFor('road').join('\n');
    expect(text).toMatch(/law/);
    expect(text).toMatch(/speed limits/);
    expect(text).toMatch(/closed course/);
    expect(text).toMatch(/prefer a dyno/);
    expect(text).toMatch(/passenger/);
  });

  it('When a dyno plan, then it covers straps, extinguisher, hearing, exhaust, fan and aborting', () => {
    const text = cautionsFor('dyno').join('\n');
    for (const word of ['straps', 'chocks', 'extinguisher', 'hearing', 'exhaust', 'fan', 'Abort']) {
      expect(text).toContain(word);
    }
  });

  it.each(['road', 'dyno'] as const)('When a %s plan, then a qualified person decides', (kind) => {
    expect(cautionsFor(kind).at(-1)).toMatch(/qualified person decides.*local codes/);
  });

  it('When the kind is unknown, then it throws naming kind', () => {
    expect(() => cautionsFor('track' as 'road')).toThrow('kind');
  });
});
