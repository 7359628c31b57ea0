import { evaluate } from 'mathjs';
import { type ColumnarLog } from '../../shared/core/channels';
import {
  alignLambda,
  DEFAULT_K_GRAMS,
  DEFAULT_TAU0_S,
  exhaustPipeDelayS,
  logAirflowGps,
  transportDelayS,
} from '../../shared/align';

describe('exhaust pipe delay (reference.md §6)', () => {
  it('1 L of pipe at idle (3.2 g/s air, 773 K) delays the gas 134 ms', () => {
    // Source: computed from the formulas (reference.md §6), worked example 134 ms [C]
    const delayS = exhaustPipeDelayS({ pipeVolumeL: 1, airflowGps: 3.2, exhaustTempK: 773 });
    expect(delayS * 1000).toBeCloseTo(134, 0);
  });

  it('1 L of pipe at 3000 rpm WOT (1073 K) gives 6.2 ms at 1 atm; 6.4 ms needs ~105 kPa', () => {
    // Source: computed from the formulas (reference.md §6) [C]. reference.md quotes 6.4 ms
    // without its airflow or pressure; with the §1 worked example's 49.659 g/s, λ 1, AFR 14.7:
    // 6.20 ms at 101.325 kPa and 6.43 ms at 105 kPa of exhaust pressure. The independent
    // mathjs unit computation below pins our arithmetic; the 6.4 ms figure is matched at 105 kPa.
    const atOneAtm = exhaustPipeDelayS({ pipeVolumeL: 1, airflowGps: 49.659, exhaustTempK: 1073 });
    const mathjs = evaluate(
      '(101.325 kPa * 1 L / (8.31432 / 0.0289644 J/(kg K) * 1073 K)) / (49.659 g/s * (1 + 1/14.7)) to ms',
    ).toNumber('ms');
    expect(atOneAtm * 1000).toBeCloseTo(mathjs, 9);
    expect(atOneAtm * 1000).toBeCloseTo(6.2, 1);
    const withBackPressure = exhaustPipeDelayS({
      pipeVolumeL: 1,
      airflowGps: 49.659,
      exhaustTempK: 1073,
      exhaustPressureKpa: 105,
    });
    expect(withBackPressure * 1000).toBeCloseTo(6.4, 1);
  });
});

describe('default delay model against the trade totals', () => {
  it('idle totals 0.3–0.5 s and high load 0.1–0.2 s', () => {
    // common practice, no published source (reference.md §6 totals [P])
    expect(DEFAULT_TAU0_S).toBe(0.1);
    expect(DEFAULT_K_GRAMS).toBe(1);
    const idle = transportDelayS(3);
    const highLoad = transportDelayS(50);
    expect(idle).toBeGreaterThanOrEqual(0.3);
    expect(idle).toBeLessThanOrEqual(0.5);
    expect(highLoad).toBeGreaterThanOrEqual(0.1);
    expect(highLoad).toBeLessThanOrEqual(0.2);
  });
});

describe('airflow estimate behind the delay', () => {
  it('2.0 L, 3000 rpm, 100 kPa, 25 °C, VE 0.85 is 49.659 g/s and τ = 0.1 + 1/49.659 s', () => {
    // Source: computed from the formulas (reference.md §1 worked example, 49.659 g/s) [C]
    const log: ColumnarLog = {
      length: 3,
      channels: {
        time: Float64Array.from([0, 0.1, 0.2]),
        rpm: new Float64Array(3).fill(3000),
        map: new Float64Array(3).fill(100),
        iat: new Float64Array(3).fill(25),
        lambda: new Float64Array(3).fill(1),
      },
    };
    // The formula gives 49.6583 (ρ 1.168431 kg/m³); reference.md rounds to 49.659, so the
    // check is relative at 1e-4, the tolerance reference.md §1 sets for R.
    const airflow = logAirflowGps(log, { displacementL: 2, nominalVe: 0.85 });
    expect(Math.abs(airflow[0] / 49.659 - 1)).toBeLessThan(1e-4);
    const { delayS } = alignLambda(log, { displacementL: 2, nominalVe: 0.85 });
    expect(delayS[1]).toBeCloseTo(0.1 + 1 / 49.659, 6);
  });
});
