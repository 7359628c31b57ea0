import {
  type PreviewWorkerReply,
  type PreviewWorkerRequest,
  computeProposalPreview,
} from './proposal-preview-compute';

// The preview of an apply, off the main thread: one answer per request, tagged with its id so
// the page can drop answers that a newer request has overtaken.
addEventListener('message', (event: MessageEvent<PreviewWorkerRequest>) => {
  const { id, input } = event.data;
  let reply: PreviewWorkerReply;
  try {
    reply = { id, ...computeProposalPreview(input) };
  } catch (error) {
    // The core throws sentences naming what is wrong (a mask off the table, a ragged grid).
    reply = { id, error: error instanceof Error ? error.message : String(error) };
  }
  postMessage(reply);
});
