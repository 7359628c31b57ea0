export {
  LOG_STATUS_LABELS,
  durationText,
  isLogPending,
  logStatusText,
} from '../../shared/ui/log-status';
import type { RevisionStatus, RevisionSummary, VeTableResource } from '@shared/contracts/tables';

/** Display names of a revision's review states. */
export const REVISION_STATUS_LABELS: Readonly<Record<RevisionStatus, string>> = {
  draft: 'Draft',
  in_review: 'In review',
  approved: 'Approved',
  sent_back: 'Sent back',
};

/** A table's size as "16 RPM × 12 MAP breakpoints". */
export function breakpointsText(table: Pick<VeTableResource, 'rpmAxis' | 'mapAxisKpa'>): string {
  return `${table.rpmAxis.length} RPM × ${table.mapAxisKpa.length} MAP breakpoints`;
}

/** The newest `count` revisions, newest first, from a list in ascending number order. */
export function latestRevisions(
  revisions: readonly RevisionSummary[],
  count: number,
): RevisionSummary[] {
  return [...revisions].sort((a, b) => b.number - a.number).slice(0, Math.max(0, count));
}
