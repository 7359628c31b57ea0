import { MAX_VE, MIN_VE } from '@shared/contracts/tables';
import { VE_RANGE, parseVeInput } from './ve-input';

describe('parseVeInput', () => {
  it('When the client range is compared with the API contract, then they agree', () => {
    expect(VE_RANGE).toEqual({ min: MIN_VE, max: MAX_VE });
  });

  it.each([
    ['85', 85],
    [' 85.5 ', 85.5],
    ['85,5', 85.5],
    ['1', 1],
    ['300', 300],
    ['102.456', 102.46],
    [97.2, 97.2],
    ['+90', 90],
    ['.5e0', null],
  ])('When %j is typed, then the value is %j', (raw, value) => {
    const result = parseVeInput(raw);
    if (value === null) expect(result.ok).toBe(false);
    else expect(result).toEqual({ ok: true, value });
  });

  it.each([
    ['', 'Type a VE value between 1 and 300 %.'],
    ['   ', 'Type a VE value between 1 and 300 %.'],
    [null, 'Type a VE value between 1 and 300 %.'],
    ['abc', '“abc” is not a number. Type a VE value in percent.'],
    ['1e2', '“1e2” is not a number. Type a VE value in percent.'],
    ['0.5', 'VE must be between 1 and 300 %; 0.5 is outside.'],
    ['301', 'VE must be between 1 and 300 %; 301 is outside.'],
    ['-4', 'VE must be between 1 and 300 %; -4 is outside.'],
  ])('When %j is typed, then it is refused with %j', (raw, message) => {
    expect(parseVeInput(raw)).toEqual({ ok: false, message });
  });
});
