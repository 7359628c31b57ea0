/**
 * Starts the preview worker. Written out in full, in a module of its own, so the application
 * builder sees the pattern and emits the worker as a same-origin file (the CSP allows only
 * `script-src 'self'`), and so Jest, whose CommonJS modules have no `import.meta`, never loads
 * it: the preview imports it only where `Worker` exists.
 */
export function startProposalPreviewWorker(): Worker {
  return new Worker(new URL('./proposal-preview.worker', import.meta.url), { type: 'module' });
}
