import { type Channel, type ColumnarLog } from '../core/channels';
import { createSeededRandom } from '../sim/seeded-random';
import { filterSamples } from './filter-samples';
import {
  CEILING_BAND,
  closedThrottleMask,
  detectLambdaCeiling,
  markOverrunEntry,
} from './lambda-ceiling';

/** One stretch of a hand-built log: `n` samples of constant throttle and speed. */
interface Stretch {
  readonly n: number;
  readonly tps: number;
  readonly rpm: number;
  /** Lambda of the k-th sample of the stretch. */
  readonly lambda: (k: number) => number;
}

const steady = (v: number) => (): number => v;
/** A pinned reading: the ceiling and 0.01 under it in turn, as a controller's resolution shows. */
const pinned =
  (ceiling: number) =>
  (k: number): number =>
    k % 2 === 0 ? ceiling : ceiling - 0.01;

const cruise = (n: number): Stretch => ({ n, tps: 20, rpm: 2500, lambda: steady(1) });
const cut = (n: number, ceiling = 1.36): Stretch => ({
  n,
  tps: 0,
  rpm: 2000,
  lambda: pinned(ceiling),
});

/** A log at 10 Hz from stretches; `without` drops channels. */
function build(stretches: readonly Stretch[], without: readonly Channel[] = []): ColumnarLog {
  const tps: number[] = [];
  const rpm: number[] = [];
  const lambda: number[] = [];
  for (const s of stretches) {
    for (let k = 0; k < s.n; k++) {
      tps.push(s.tps);
      rpm.push(s.rpm);
      lambda.push(s.lambda(k));
    }
  }
  const length = lambda.length;
  const channels: Partial<Record<Channel, Float64Array>> = {
    time: Float64Array.from({ length }, (_, i) => i / 10),
    tps: Float64Array.from(tps),
    rpm: Float64Array.from(rpm),
    lambda: Float64Array.from(lambda),
  };
  for (const name of without) delete channels[name];
  return { length, channels };
}

/** Indices of removed samples. */
function removedIndices(keep: Uint8Array): number[] {
  return Array.from(keep.entries())
    .filter(([, k]) => k === 0)
    .map(([i]) => i);
}

/** Indices of marked samples. */
function markedIndices(marks: Uint8Array): number[] {
  return Array.from(marks.entries())
    .filter(([, m]) => m === 1)
    .map(([i]) => i);
}

/** Indices from `from` to `to`, both included. */
function span(from: number, to: number): number[] {
  return Array.from({ length: to - from + 1 }, (_, k) => from + k);
}

// Hand-built logs at 10 Hz; every expectation is worked out by hand from the rule's definition.
// The thresholds themselves are common practice, no published source [P].
describe('detectLambdaCeiling', () => {
  it('When the log sits at its leanest reading on a closed throttle for 2 s, then that is its ceiling', () => {
    // Two 1 s stretches (10 samples each: 0.9 s from first to last plus one 0.1 s step).
    const log = build([cruise(20), cut(10), cruise(20), cut(10), cruise(20)]);
    const ceiling = detectLambdaCeiling(log);
    expect(ceiling).not.toBeNull();
    expect(ceiling!.lambda).toBe(1.36);
    expect(ceiling!.fromLambda).toBeCloseTo(1.36 * (1 - CEILING_BAND), 12);
    expect(ceiling!.runs).toBe(2);
    expect(ceiling!.plateauS).toBeCloseTo(2, 9);
  });

  it.each<[string, Stretch[]]>([
    // 3 samples are 0.3 s, under the 0.4 s a stretch needs, however many there are.
    ['stretches are too short', [cruise(5), cut(3), cruise(5), cut(3), cruise(5), cut(3)]],
    // 1 s in all is under the 1.5 s a plateau needs.
    ['the plateau is too short in all', [cruise(20), cut(10), cruise(20)]],
    [
      'the plateau is held with the throttle open',
      [cruise(20), { ...cut(30), tps: 30 }, cruise(20)],
    ],
    ['the plateau sits below λ 1.15', [cruise(20), cut(30, 1.12), cruise(20)]],
  ])('When %s, then there is no ceiling', (_name, stretches) => {
    expect(detectLambdaCeiling(build(stretches))).toBeNull();
  });

  it('When glitches read far above the ceiling, then the ceiling is still found', () => {
    const glitch: Stretch = { n: 1, tps: 20, rpm: 2500, lambda: steady(4) };
    const log = build([cruise(10), glitch, cruise(10), cut(20), glitch, cut(20), cruise(10)]);
    expect(detectLambdaCeiling(log)?.lambda).toBe(1.36);
  });

  it('When a short dip under the band interrupts the plateau, then it stays one stretch', () => {
    // 8 + 1 + 8 samples: each half is 0.8 s; bridged, one stretch of 1.7 s.
    const dip: Stretch = { n: 1, tps: 0, rpm: 2000, lambda: steady(1.3) };
    const log = build([cruise(10), cut(8), dip, cut(8), cruise(10)]);
    expect(detectLambdaCeiling(log)).toMatchObject({ runs: 1 });
    expect(detectLambdaCeiling(log)!.plateauS).toBeCloseTo(1.7, 9);
  });

  describe('without a throttle channel', () => {
    const random = createSeededRandom(11);
    const noisy = (centre: number) => (): number => centre * (1 + 0.004 * random.normal());
    const clipped = (ceiling: number) => (): number =>
      Math.min(ceiling, ceiling * (1 + 0.004 * random.normal()));

    it.each([1.16, 1.2, 1.25, 1.3])(
      'When a lean cruise (λ %s, 0.4 % noise) is held for a minute, then no ceiling is invented',
      (centre) => {
        const lean: Stretch = { n: 600, tps: 30, rpm: 2500, lambda: noisy(centre) };
        expect(detectLambdaCeiling(build([cruise(20), lean, cruise(20)], ['tps']))).toBeNull();
      },
    );

    it('When a noisy reading is clipped at 1.36 for 3 s, then 1.36 is the ceiling', () => {
      const pin: Stretch = { n: 15, tps: 0, rpm: 2000, lambda: clipped(1.36) };
      const log = build([cruise(20), pin, cruise(20), pin, cruise(20)], ['tps']);
      expect(detectLambdaCeiling(log)?.lambda).toBe(1.36);
    });
  });

  it('When the log has no lambda, then there is no ceiling', () => {
    expect(detectLambdaCeiling(build([cut(30)], ['lambda']))).toBeNull();
  });
});

describe('closedThrottleMask', () => {
  it('When the throttle rests at 1.5 %, then readings up to 3.5 % are closed', () => {
    const tps = Float64Array.from([1.5, 1.5, 3.5, 3.6, 20, Number.NaN]);
    expect(Array.from(closedThrottleMask(tps))).toEqual([1, 1, 1, 0, 0, 0]);
  });

  it('When the throttle never closes, then light cruise is not called closed', () => {
    // The lowest reading, 12 %, is taken as 5 %: closed means up to 7 %.
    const tps = Float64Array.from([12, 14, 30, 50]);
    expect(Array.from(closedThrottleMask(tps))).toEqual([0, 0, 0, 0]);
  });
});

describe('markOverrunEntry', () => {
  // Idle at 850 rpm, cruise, then an overrun at 2200 rpm whose lambda climbs 1.0 → 1.15 → 1.3.
  const idle: Stretch = { n: 20, tps: 0, rpm: 850, lambda: steady(1) };
  const overrun = (rpm: number): Stretch => ({
    n: 8,
    tps: 0,
    rpm,
    lambda: (k) => [1, 1, 1, 1.15, 1.3, 1.3, 1.3, 1.3][k] as number,
  });
  /** Central differences, λ/s, at 10 Hz (0 at the ends). */
  const centralRate = (lambda: Float64Array): Float64Array =>
    Float64Array.from(lambda, (_, i) =>
      i === 0 || i === lambda.length - 1 ? 0 : (lambda[i + 1] - lambda[i - 1]) / 0.2,
    );

  it('When lambda climbs on a closed throttle above idle to λ 1.15, then the climb is marked', () => {
    // Overrun at samples 40–47: rates (central) 0.75 λ/s at 42, 1.5 at 43, 0.75 at 44; the
    // reading is 1.15 at 43, within 0.5 s of all three.
    const log = build([idle, cruise(20), overrun(2200), cruise(20)]);
    const marks = markOverrunEntry(log, centralRate(log.channels.lambda!));
    expect(markedIndices(marks!)).toEqual([42, 43, 44]);
  });

  it('When the same climb happens at idle speed, then nothing is marked', () => {
    const log = build([idle, cruise(20), overrun(900), cruise(20)]);
    expect(markedIndices(markOverrunEntry(log, centralRate(log.channels.lambda!))!)).toEqual([]);
  });

  it('When lambda climbs but stays richer than λ 1.15 (a gear change), then it is not marked', () => {
    // A gear change at 40–47 (rates 0.5 and 1 λ/s at 41 and 42), a real overrun at 68–75.
    const shift: Stretch = { ...overrun(2200), lambda: (k) => [0.8, 0.8, 0.9, 1][k] ?? 1 };
    const log = build([idle, cruise(20), shift, cruise(20), overrun(2200), cruise(20)]);
    const marks = markOverrunEntry(log, centralRate(log.channels.lambda!));
    expect(markedIndices(marks!)).toEqual([70, 71, 72]);
  });

  it('When the log has no throttle or no engine speed, then there is no answer', () => {
    const rate = new Float64Array(28);
    expect(markOverrunEntry(build([idle, overrun(2200)], ['tps']), rate)).toBeNull();
    expect(markOverrunEntry(build([idle, overrun(2200)], ['rpm']), rate)).toBeNull();
  });
});

describe('filterSamples, fuel cut at the log’s own ceiling', () => {
  it('When the log shows a 1.36 ceiling, then the plateau and 1 s after go and the funnel names it', () => {
    // Plateaus at 20–29 and 50–59; 1 s settle reaches 39 and 69. The rise into each: the
    // 5-sample fit (0.3 s at 10 Hz) of the step 1 → 1.36 gives 0.72 and 1.06 λ/s on the two
    // samples before it, under 0.5 s before the ceiling. Closed-throttle speed is 2000 rpm
    // throughout, so idle is 2000 and no overrun is above it.
    const log = build([cruise(20), cut(10), cruise(20), cut(10), cruise(20)]);
    const { keep, funnel } = filterSamples(log, [{ kind: 'fuelCut' }]);
    expect(removedIndices(keep)).toEqual([...span(18, 39), ...span(48, 69)]);
    expect(funnel[0]).toMatchObject({
      label:
        "fuel cut (flag, lambda ≥ 1.6, lambda at the log's ceiling 1.36, or closed-throttle overrun) and 1 s after",
      removed: 44,
      detail: { ceilingLambda: 1.36 },
    });
  });

  it('When the overrun climbs into cut without reaching a ceiling, then the climb and 1 s after go', () => {
    // The climb at 42–44 (5-sample fit at 10 Hz: slopes 0.75, 0.9 and 0.75 λ/s; 0.3 at 41 and
    // 45), then 1 s after 4.4 s: samples 42–54.
    const overrun: Stretch = {
      n: 8,
      tps: 0,
      rpm: 2200,
      lambda: (k) => [1, 1, 1, 1.15, 1.3, 1.3, 1.3, 1.3][k] as number,
    };
    const idle: Stretch = { n: 20, tps: 0, rpm: 850, lambda: steady(1) };
    const log = build([idle, cruise(20), overrun, cruise(22)]);
    const { keep, funnel } = filterSamples(log, [{ kind: 'fuelCut' }], { rateWindowS: 0.4 });
    expect(removedIndices(keep)).toEqual(span(42, 54));
    expect(funnel[0].label).toBe(
      'fuel cut (flag, lambda ≥ 1.6, or closed-throttle overrun) and 1 s after',
    );
    expect(funnel[0].detail).toBeUndefined();
  });

  it('When the log has neither throttle nor engine speed, then only flag, limit and ceiling are named', () => {
    const log = build([cruise(20), cut(10), cruise(20), cut(10), cruise(20)], ['tps', 'rpm']);
    const { funnel } = filterSamples(log, [{ kind: 'fuelCut', settleS: 0.5 }]);
    // Without a throttle the plateau must look clipped: half its readings are the top one (within
    // 0.3 % of it) and nothing lies above it. With the rise and 0.5 s settle: 18–34 and 48–64.
    expect(funnel[0]).toMatchObject({
      label: "fuel cut (flag, lambda ≥ 1.6, or lambda at the log's ceiling 1.36) and 0.5 s after",
      removed: 34,
    });
  });

  it('When the log reaches the fixed limit, then the fixed limit still counts (1.6 logs behave)', () => {
    // One reading at 1.7 among cruise: no plateau, but ≥ 1.6; settle 0.2 s.
    const spike: Stretch = { n: 1, tps: 20, rpm: 2500, lambda: steady(1.7) };
    const log = build([cruise(10), spike, cruise(10)]);
    const { keep, funnel } = filterSamples(log, [{ kind: 'fuelCut', settleS: 0.2 }]);
    expect(removedIndices(keep)).toEqual([10, 11, 12]);
    expect(funnel[0].detail).toBeUndefined();
  });
});
