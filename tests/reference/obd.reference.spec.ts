import {
  obdFuelSystemStatus,
  obdFuelTrimPct,
  obdLambda,
  obdMapKpa,
  obdRpm,
  obdTemperatureC,
  obdThrottlePct,
  obdWidebandMilliamps,
  obdWidebandVolts,
} from '../../shared/units';

// Source for the formulas: the Wikipedia "OBD-II PIDs" table (SAE J1979 / ISO 15031-5), read
// via the liquisearch and aidilj mirrors and Stack Overflow question 36267335 [S]; the check
// bytes and their values are computed from those formulas (reference.md §5) [C].
describe('OBD-II byte scalings', () => {
  it('PID 0x05 coolant: 0x7B → 83 °C; PID 0x0F intake: 0x41 → 25 °C', () => {
    expect(obdTemperatureC(0x7b)).toBe(83);
    expect(obdTemperatureC(0x41)).toBe(25);
  });

  it('PIDs 0x06–0x09 fuel trims: 0x85 → +3.906 %, 0x70 → −12.5 %, 0xFF → 99.219 %', () => {
    expect(obdFuelTrimPct(0x85)).toBeCloseTo(3.906, 3);
    expect(obdFuelTrimPct(0x70)).toBeCloseTo(-12.5, 10);
    expect(obdFuelTrimPct(0xff)).toBeCloseTo(99.219, 3);
  });

  it('PID 0x0B MAP saturates at 255 kPa (22.29 psig over a standard barometer)', () => {
    expect(obdMapKpa(255)).toBe(255);
    expect((255 - 101.325) / 6.894757293).toBeCloseTo(22.29, 2);
  });

  it('PID 0x0C engine speed: 1A F8 → 1726 rpm', () => {
    expect(obdRpm(0x1a, 0xf8)).toBe(1726);
  });

  it('PID 0x11 throttle: 0x80 → 50.196 %', () => {
    expect(obdThrottlePct(0x80)).toBeCloseTo(50.196, 3);
  });

  it('PIDs 0x24–0x2B: λ 80 00 → 1.000, voltage 80 00 → 4.0 V', () => {
    expect(obdLambda(0x80, 0x00)).toBe(1);
    expect(obdWidebandVolts(0x80, 0x00)).toBe(4);
  });

  it('PIDs 0x34–0x3B: λ 6C CC → 0.849976, current 80 00 → 0 mA', () => {
    expect(obdLambda(0x6c, 0xcc)).toBeCloseTo(0.849976, 6);
    expect(obdWidebandMilliamps(0x80, 0x00)).toBe(0);
  });

  it('PID 0x44 commanded λ: FF FF → 1.99997', () => {
    expect(obdLambda(0xff, 0xff)).toBeCloseTo(1.99997, 5);
  });

  it('PID 0x03 fuel system status: 2 closed loop, 4 load or fuel cut, 1 cold, 16 closed with fault', () => {
    // Source: the Wikipedia "OBD-II PIDs" table as quoted in a public forum post [S]
    expect(obdFuelSystemStatus(2)).toEqual({
      cold: false,
      closedLoop: true,
      openLoopLoadOrCut: false,
      fault: false,
    });
    expect(obdFuelSystemStatus(4).openLoopLoadOrCut).toBe(true);
    expect(obdFuelSystemStatus(1).cold).toBe(true);
    expect(obdFuelSystemStatus(16)).toMatchObject({ closedLoop: true, fault: true });
  });

  it('refuses a value that is not a byte, naming the argument', () => {
    expect(() => obdRpm(256, 0)).toThrow(/a must be a byte/);
    expect(() => obdLambda(1, 1.5)).toThrow(/b must be a byte/);
  });
});
