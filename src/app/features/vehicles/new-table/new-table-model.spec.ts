import { draftFromAxes, draftFromText, parseBreakpoints } from './new-table-model';

describe('new table model', () => {
  const exported = [
    'map_kpa\\rpm,1000,2000,3000',
    '40,40,45,50',
    '70,55,62,70',
    '100,70,80,88',
    '',
  ].join('\r\n');

  it('When our export is read, then the draft has its axes and values as stored', () => {
    const draft = draftFromText(exported, 'auto', 'auto');
    expect(draft).toMatchObject({
      ok: true,
      rpmAxis: [1000, 2000, 3000],
      mapAxisKpa: [40, 70, 100],
      values: [
        [40, 45, 50],
        [55, 62, 70],
        [70, 80, 88],
      ],
    });
  });

  it('When a cell holds text, then the refusal names its row and column', () => {
    const broken = exported.replace('62', 'abc');
    const draft = draftFromText(broken, 'auto', 'auto');
    expect(draft.ok).toBe(false);
    expect(draft.ok ? '' : draft.message).toMatch(/^Row 2, column 2 holds "abc"/);
  });

  it('When axes are typed, then a rising start goes from 60 % to 100 % of the estimate', () => {
    const draft = draftFromAxes('1000, 2000', '20 60 100', 80, 'rising');
    expect(draft).toMatchObject({
      ok: true,
      rpmAxis: [1000, 2000],
      mapAxisKpa: [20, 60, 100],
      values: [
        [48, 48],
        [64, 64],
        [80, 80],
      ],
    });
    expect(draftFromAxes('1000, 2000', '20, 100', 75, 'flat')).toMatchObject({
      values: [
        [75, 75],
        [75, 75],
      ],
    });
  });

  it('When breakpoints fall, repeat or are not numbers, then it says which', () => {
    expect(parseBreakpoints('1000, 900', 'RPM')).toBe(
      'RPM: breakpoints must rise (900 after 1000)',
    );
    expect(parseBreakpoints('1000; 1000', 'RPM')).toMatch(/must rise/);
    expect(parseBreakpoints('20, x', 'MAP')).toBe('MAP: "x" is not a number');
    expect(parseBreakpoints('20', 'MAP')).toBe('MAP: give at least 2 breakpoints');
    expect(draftFromAxes('1000, 2000', '20, 2000', 80, 'flat')).toEqual({
      ok: false,
      message: 'MAP breakpoints must lie within 1–1000 kPa',
    });
  });
});
