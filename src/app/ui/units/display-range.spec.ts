import { displayRange, rangeText } from './display-range';
import { fromDisplay } from './display-units';

describe('displayRange', () => {
  it('When the units are metric, then the API range passes through', () => {
    expect(displayRange('displacement', { min: 0.05, max: 20 }, 'metric')).toEqual({
      min: 0.05,
      max: 20,
      unit: 'L',
    });
  });

  it.each([
    // 0.05 L = 3.051 ci, 20 L = 1220.47 ci: rounded inward to 0.1 ci
    ['displacement', { min: 0.05, max: 20 }, {}, { min: 3.1, max: 1220.4, unit: 'ci' }],
    // 200 mm = 7.874 in, 1500 mm = 59.055 in: inward to 0.01 in
    ['tyreDiameter', { min: 200, max: 1500 }, {}, { min: 7.88, max: 59.05, unit: 'in' }],
    // 10 and 10000 cc/min of gasoline = 0.985 and 985.47 lb/h: inward to 0.1 lb/h
    ['injectorFlow', { min: 10, max: 10000 }, {}, { min: 1, max: 985.4, unit: 'lb/h' }],
    [
      'injectorFlow',
      { min: 10, max: 10000 },
      { fuel: 'e85' },
      { min: 1.1, max: 1034.9, unit: 'lb/h' },
    ],
  ] as const)('When %p %p is shown in imperial (%p), then it is %p', (q, metric, ctx, range) => {
    const shown = displayRange(q, metric, 'imperial', ctx);
    expect(shown.unit).toBe(range.unit);
    expect(shown.min).toBeCloseTo(range.min, 9);
    expect(shown.max).toBeCloseTo(range.max, 9);
  });

  it.each(['displacement', 'tyreDiameter', 'injectorFlow', 'pressure', 'speed'] as const)(
    'When the ends of the shown %p range are typed, then they convert back inside the API range',
    (quantity) => {
      const metric = { min: 10, max: 1000 };
      const shown = displayRange(quantity, metric, 'imperial', { fuel: 'methanol' });
      for (const end of [shown.min, shown.max]) {
        const back = fromDisplay(quantity, end, 'imperial', { fuel: 'methanol' });
        expect(back).toBeGreaterThanOrEqual(metric.min);
        expect(back).toBeLessThanOrEqual(metric.max);
      }
    },
  );
});

describe('rangeText', () => {
  it.each([
    ['displacement', 'metric', { min: 0.05, max: 20, unit: 'L' }, '0.05–20 L'],
    ['displacement', 'imperial', { min: 3.1, max: 1220.4, unit: 'ci' }, '3.1–1220.4 ci'],
    ['tyreDiameter', 'imperial', { min: 7.88, max: 59.05, unit: 'in' }, '7.88–59.05 in'],
    ['injectorFlow', 'metric', { min: 10, max: 10000, unit: 'cc/min' }, '10–10000 cc/min'],
  ] as const)('When %p in %p spans %p, then it reads %p', (quantity, units, range, text) => {
    expect(rangeText(range, quantity, units)).toBe(text);
  });
});
