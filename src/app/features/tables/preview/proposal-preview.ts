import { DestroyRef, Injectable, InjectionToken, computed, inject, signal } from '@angular/core';
import {
  type PreviewInput,
  type PreviewResult,
  type PreviewWorkerReply,
  computeProposalPreview,
} from './proposal-preview-compute';

/** How long the preview waits for the options to settle before it computes, ms. */
export const PREVIEW_DEBOUNCE_MS = new InjectionToken<number>('PREVIEW_DEBOUNCE_MS', {
  factory: () => 150,
});

/**
 * Starts the preview's worker; resolves to null where the platform has none (jsdom in tests),
 * and the preview then computes on the main thread.
 */
export const PREVIEW_WORKER_FACTORY = new InjectionToken<() => Promise<Worker | null>>(
  'PREVIEW_WORKER_FACTORY',
  { factory: () => startPreviewWorker },
);

async function startPreviewWorker(): Promise<Worker | null> {
  if (typeof Worker === 'undefined') return null;
  const { startProposalPreviewWorker } = await import('./proposal-preview-worker-start');
  return startProposalPreviewWorker();
}

/** Where a preview stands. */
interface PreviewState {
  /** The latest preview (values rounded as the server stores them); null when there is none. */
  readonly result: PreviewResult | null;
  /** The request `result` answers; null with no result. */
  readonly resultFor: PreviewInput | null;
  /** Why the latest request could not be computed, or null. */
  readonly error: string | null;
  /** Whether a newer request is waiting or being computed. */
  readonly isComputing: boolean;
}

const EMPTY: PreviewState = { result: null, resultFor: null, error: null, isComputing: false };

/**
 * The live preview of applying an analysis: debounced, computed in a Web Worker when the
 * platform has one (else on the spot), and only the answer to the newest request is kept.
 * Provide it next to the store that shows the preview (`AnalysisStore`); its worker ends with the
 * component that provides them.
 */
@Injectable()
export class ProposalPreview {
  private readonly debounceMs = inject(PREVIEW_DEBOUNCE_MS);
  private readonly startWorker = inject(PREVIEW_WORKER_FACTORY);

  private readonly state = signal<PreviewState>(EMPTY);
  /** The worker once asked for: resolves to null when there is none or it failed. */
  private workerReady: Promise<Worker | null> | null = null;
  private worker: Worker | null = null;
  private isDestroyed = false;
  private latestId = 0;
  private latestInput: PreviewInput | null = null;
  private timer: ReturnType<typeof setTimeout> | undefined;

  /** The latest preview: values, each cell's origin and the held count; null when there is none. */
  readonly result = computed(() => this.state().result);
  /**
   * The request the latest preview answers (the very object passed to `request`), so an owner can
   * tell a preview of its current analysis from one of an analysis it showed before.
   */
  readonly resultFor = computed(() => this.state().resultFor);
  /** The latest preview values `[row][col]`, null when there is none. */
  readonly values = computed(() => this.state().result?.values ?? null);
  /** Why the latest preview could not be computed, or null. */
  readonly error = computed(() => this.state().error);
  /** Whether a preview is on its way. */
  readonly isComputing = computed(() => this.state().isComputing);

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      this.isDestroyed = true;
      clearTimeout(this.timer);
      this.worker?.terminate();
      this.worker = null;
    });
  }

  /**
   * Asks for the preview of `input` once the options have been still for the debounce time;
   * null clears the preview at once (no analysis, or options that are not valid).
   */
  request(input: PreviewInput | null): void {
    clearTimeout(this.timer);
    const id = ++this.latestId;
    this.latestInput = input;
    if (!input) {
      this.state.set(EMPTY);
      return;
    }
    this.state.update((s) => ({ ...s, isComputing: true }));
    this.timer = setTimeout(() => this.compute(id, input), this.debounceMs);
  }

  private compute(id: number, input: PreviewInput): void {
    this.workerReady ??= this.startWorker().then(
      (worker) => this.attach(worker),
      // A worker module that cannot be loaded leaves the main thread to do the work.
      () => null,
    );
    void this.workerReady.then((worker) => {
      if (id !== this.latestId || this.isDestroyed) return;
      if (worker) worker.postMessage({ id, input });
      else this.settle(computeHere(id, input));
    });
  }

  private attach(worker: Worker | null): Worker | null {
    if (!worker) return null;
    if (this.isDestroyed) {
      worker.terminate();
      return null;
    }
    this.worker = worker;
    worker.onmessage = (event: MessageEvent<PreviewWorkerReply>) => this.settle(event.data);
    // A worker that fails (blocked script, old browser) must not leave the preview hanging:
    // compute the newest request here and stay on the main thread from then on.
    worker.onerror = (event) => {
      event.preventDefault();
      worker.terminate();
      this.worker = null;
      this.workerReady = Promise.resolve(null);
      if (this.latestInput) this.settle(computeHere(this.latestId, this.latestInput));
    };
    return worker;
  }

  private settle(reply: PreviewWorkerReply): void {
    // An answer overtaken by a newer request is stale: the newer one is on its way.
    if (reply.id !== this.latestId || this.isDestroyed) return;
    if ('error' in reply) {
      this.state.set({ result: null, resultFor: null, error: reply.error, isComputing: false });
      return;
    }
    const { values, origin, heldCount, guard } = reply;
    this.state.set({
      result: { values, origin, heldCount, guard },
      resultFor: this.latestInput,
      error: null,
      isComputing: false,
    });
  }
}

/** The preview computed on the main thread, answered as the worker would. */
function computeHere(id: number, input: PreviewInput): PreviewWorkerReply {
  try {
    return { id, ...computeProposalPreview(input) };
  } catch (error) {
    // Same as in the worker: the core's sentence is what the user needs to read.
    return { id, error: error instanceof Error ? error.message : String(error) };
  }
}
