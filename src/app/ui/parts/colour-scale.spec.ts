import {
  DIVERGING_STOPS,
  SEQUENTIAL_STOPS,
  TEXT_ON_DARK,
  TEXT_ON_LIGHT,
  colourAt,
  contrastRatio,
  divergingColour,
  gradientCss,
  hexToRgb,
  oklabToRgb,
  readableTextColour,
  relativeLuminance,
  rgbToHex,
  rgbToOklab,
  sequentialColour,
} from './colour-scale';

/** OKLab lightness of a hex colour. */
const lightness = (hex: string): number => rgbToOklab(hexToRgb(hex))[0];
/** OKLab `b` axis (positive = yellow/orange, negative = blue). */
const yellowBlue = (hex: string): number => rgbToOklab(hexToRgb(hex))[2];

describe('colour-scale', () => {
  it.each([
    ['#000000', [0, 0, 0]],
    ['#ffffff', [255, 255, 255]],
    ['#1b2f63', [27, 47, 99]],
    ['#abc', [170, 187, 204]],
  ] as const)('When %s is read, then its channels are %j', (hex, rgb) => {
    expect(hexToRgb(hex)).toEqual(rgb);
    if (hex.length === 7) expect(rgbToHex(hexToRgb(hex))).toBe(hex);
  });

  it('When a text is not a colour, then hexToRgb names the text', () => {
    expect(() => hexToRgb('teal')).toThrow('"teal" is not a #rrggbb colour');
  });

  it.each([
    // [C] white is L = 1, black L = 0 in OKLab by construction.
    ['#ffffff', 1],
    ['#000000', 0],
  ])('When %s goes to OKLab, then L is %d', (hex, l) => {
    expect(lightness(hex)).toBeCloseTo(l, 4);
  });

  it.each(['#1b2f63', '#4fae9f', '#c25a0c', '#efeeea'])(
    'When %s goes to OKLab and back, then it is unchanged',
    (hex) => {
      expect(rgbToHex(oklabToRgb(rgbToOklab(hexToRgb(hex))))).toBe(hex);
    },
  );

  it.each([
    ['sequential', SEQUENTIAL_STOPS],
    ['diverging', DIVERGING_STOPS],
  ] as const)('When the %s scale is read at its ends, then it gives its end stops', (_, stops) => {
    expect(colourAt(stops, 0)).toBe(stops[0].hex);
    expect(colourAt(stops, 1)).toBe(stops[stops.length - 1].hex);
    expect(colourAt(stops, -3)).toBe(stops[0].hex);
    expect(colourAt(stops, 7)).toBe(stops[stops.length - 1].hex);
  });

  it('When the sequential scale is sampled low to high, then its lightness only rises', () => {
    const samples = Array.from({ length: 41 }, (_, i) => lightness(sequentialColour(i, 0, 40)));
    for (let i = 1; i < samples.length; i++) expect(samples[i]).toBeGreaterThan(samples[i - 1]);
  });

  it.each([
    [50, 0, 100, 0.5],
    [0, 0, 100, 0],
    [100, 0, 100, 1],
    [7, 7, 7, 0.5],
  ])('When %d lies in %d–%d, then it takes the colour at %d', (value, min, max, t) => {
    expect(sequentialColour(value, min, max)).toBe(colourAt(SEQUENTIAL_STOPS, t));
  });

  it('When the diverging scale is read at zero, then it is the neutral midpoint', () => {
    expect(divergingColour(0, 10)).toBe('#efeeea');
  });

  it.each([
    [-10, 'blue', -1],
    [-3, 'blue', -1],
    [3, 'orange', 1],
    [25, 'orange', 1],
  ] as const)('When the diverging value is %d, then the colour leans %s', (value, _, sign) => {
    expect(Math.sign(yellowBlue(divergingColour(value, 10)))).toBe(sign);
  });

  it('When values grow away from zero, then the diverging colour darkens on each side', () => {
    for (const sign of [-1, 1]) {
      const l = [0, 2.5, 5, 7.5, 10].map((v) => lightness(divergingColour(sign * v, 10)));
      for (let i = 1; i < l.length; i++) expect(l[i]).toBeLessThan(l[i - 1]);
    }
  });

  it('When the diverging limit is not positive, then it throws naming the limit', () => {
    expect(() => divergingColour(1, 0)).toThrow('limit must be > 0');
  });

  it('When a legend gradient is built, then it starts and ends at the stops', () => {
    const css = gradientCss(SEQUENTIAL_STOPS, 3);
    expect(css).toMatch(
      /^linear-gradient\(to right, #1b2f63 0%, #[0-9a-f]{6} 50%, #eef6e6 100%\)$/,
    );
  });
});

describe('contrast', () => {
  it.each([
    // [S*] WCAG 2: white on black is 21:1; a colour against itself 1:1.
    ['#ffffff', '#000000', 21],
    ['#777777', '#777777', 1],
  ])('When %s meets %s, then the ratio is %d', (a, b, ratio) => {
    expect(contrastRatio(a, b)).toBeCloseTo(ratio, 5);
  });

  it.each([
    ['#ffffff', TEXT_ON_LIGHT],
    ['#eef6e6', TEXT_ON_LIGHT],
    ['#efeeea', TEXT_ON_LIGHT],
    ['#000000', TEXT_ON_DARK],
    ['#1b2f63', TEXT_ON_DARK],
    ['#23509b', TEXT_ON_DARK],
  ])('When the cell is %s, then the text is %s', (background, text) => {
    expect(readableTextColour(background)).toBe(text);
  });

  it('When every colour of both scales gets its text colour, then contrast is at least 4.5:1', () => {
    for (let i = 0; i <= 50; i++) {
      for (const stops of [SEQUENTIAL_STOPS, DIVERGING_STOPS]) {
        const bg = colourAt(stops, i / 50);
        expect(contrastRatio(bg, readableTextColour(bg))).toBeGreaterThanOrEqual(4.5);
      }
    }
  });

  it('When luminance is read, then white is 1 and black 0', () => {
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 6);
    expect(relativeLuminance('#000000')).toBe(0);
  });
});
