import { TestBed } from '@angular/core/testing';
import { PREVIEW_DEBOUNCE_MS, PREVIEW_WORKER_FACTORY, ProposalPreview } from './proposal-preview';
import {
  type PreviewInput,
  type PreviewWorkerReply,
  type PreviewWorkerRequest,
  computeProposalPreview,
} from './proposal-preview-compute';

/** A 2×2 analysis: every cell trusted and measured 10 % lean. */
function input(stepFraction: number): PreviewInput {
  const cell = { weight: 50, ratio: 1.1, spread: 0.01 };
  return {
    rpmAxis: [1000, 2000],
    mapAxisKpa: [40, 80],
    baseValues: [
      [50, 60],
      [70, 80],
    ],
    cells: [
      [cell, cell],
      [cell, cell],
    ],
    settings: {},
    apply: { stepFraction, smooth: 0 },
  };
}

/** A worker stand-in that keeps what it is sent and answers when told to. */
class FakeWorker {
  readonly sent: PreviewWorkerRequest[] = [];
  onmessage: ((event: MessageEvent<PreviewWorkerReply>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  isTerminated = false;

  postMessage(request: PreviewWorkerRequest): void {
    this.sent.push(request);
  }

  terminate(): void {
    this.isTerminated = true;
  }

  /** Answers request `index` as the real worker would. */
  answer(index: number): void {
    const request = this.sent[index] as PreviewWorkerRequest;
    const data = { id: request.id, ...computeProposalPreview(request.input) };
    this.onmessage?.({ data } as MessageEvent<PreviewWorkerReply>);
  }

  /** Fails as a worker whose script cannot load. */
  fail(): void {
    this.onerror?.({ preventDefault: () => undefined } as ErrorEvent);
  }
}

/** Lets the debounce timer and the worker start-up promise run. */
async function settle(): Promise<void> {
  await new Promise((resolve) => setTimeout(resolve, 5));
}

describe('ProposalPreview', () => {
  function setUp(worker: FakeWorker | null): ProposalPreview {
    TestBed.configureTestingModule({
      providers: [
        ProposalPreview,
        { provide: PREVIEW_DEBOUNCE_MS, useValue: 1 },
        {
          provide: PREVIEW_WORKER_FACTORY,
          useValue: async () => worker as unknown as Worker | null,
        },
      ],
    });
    return TestBed.inject(ProposalPreview);
  }

  it('When there is no worker, then the preview is computed on the main thread', async () => {
    const preview = setUp(null);
    preview.request(input(0.5));
    expect(preview.isComputing()).toBe(true);
    await settle();
    expect(preview.values()).toEqual([
      [52.5, 63],
      [73.5, 84],
    ]);
    // Every cell is trusted: measured, none held, the default guard ran.
    expect(preview.result()).toMatchObject({
      origin: [
        ['measured', 'measured'],
        ['measured', 'measured'],
      ],
      heldCount: 0,
      guard: { leanAllowance: 0.01 },
    });
    // 90 % of 101.325 kPa, the core's default line.
    expect(preview.result()?.guard?.loadLineKpa).toBeCloseTo(91.1925, 9);
    expect(preview.isComputing()).toBe(false);
  });

  it('When the worker answers, then the origin and the held count arrive with the values', async () => {
    const worker = new FakeWorker();
    const preview = setUp(worker);
    // The 80 kPa row lies above a 60 kPa load line; its cells have no data and the 40 kPa row
    // is measured 10 % rich, so the fill would lean them by 5 %: the guard holds them.
    const cell = { weight: 50, ratio: 0.9, spread: 0.01 };
    const none = { weight: 0, ratio: null, spread: null };
    preview.request({
      ...input(1),
      cells: [
        [cell, cell],
        [none, none],
      ],
      settings: { guard: { loadLineKpa: 60, leanAllowancePercent: 1 } },
    });
    await settle();
    worker.answer(0);
    expect(preview.result()).toMatchObject({
      values: [
        [45, 54],
        [70, 80],
      ],
      origin: [
        ['measured', 'measured'],
        ['held', 'held'],
      ],
      heldCount: 2,
      guard: { loadLineKpa: 60, leanAllowance: 0.01 },
    });
  });

  it('When requests follow each other quickly, then only the last is computed', async () => {
    const worker = new FakeWorker();
    const preview = setUp(worker);
    preview.request(input(0.2));
    preview.request(input(0.4));
    preview.request(input(1));
    await settle();
    expect(worker.sent).toHaveLength(1);
    expect(worker.sent[0]?.input.apply.stepFraction).toBe(1);
  });

  it('When an older answer arrives after a newer request, then it is dropped', async () => {
    const worker = new FakeWorker();
    const preview = setUp(worker);
    preview.request(input(0.5));
    await settle();
    preview.request(input(1));
    await settle();
    expect(worker.sent).toHaveLength(2);

    worker.answer(1);
    worker.answer(0);

    // Step 1 applies the full 10 %; the stale step-0.5 answer must not overwrite it.
    expect(preview.values()).toEqual([
      [55, 66],
      [77, 88],
    ]);
  });

  it('When the request is cleared, then the preview is null and late answers are dropped', async () => {
    const worker = new FakeWorker();
    const preview = setUp(worker);
    preview.request(input(0.5));
    await settle();
    preview.request(null);
    worker.answer(0);
    expect(preview.values()).toBeNull();
    expect(preview.isComputing()).toBe(false);
  });

  it('When the worker fails, then the newest request is computed on the main thread', async () => {
    const worker = new FakeWorker();
    const preview = setUp(worker);
    preview.request(input(1));
    await settle();
    worker.fail();
    expect(worker.isTerminated).toBe(true);
    expect(preview.values()?.[0]).toEqual([55, 66]);
  });

  it('When the inputs cannot be computed, then the core’s sentence is the error', async () => {
    const preview = setUp(null);
    preview.request({ ...input(0.5), apply: { onlyCells: [[5, 0]] } });
    await settle();
    expect(preview.values()).toBeNull();
    expect(preview.error()).toBe('onlyCells: cell [5, 0] is outside the 2×2 table');
  });

  it('When its owner is destroyed, then the worker ends', async () => {
    const worker = new FakeWorker();
    const preview = setUp(worker);
    preview.request(input(0.5));
    await settle();
    TestBed.resetTestingModule();
    expect(worker.isTerminated).toBe(true);
  });
});
