export {
  LOG_STATUS_LABELS,
  durationText,
  isLogPending,
  logStatusText,
} from '../../ui/parts/log-status';
import type { UnitSystem } from '@shared/contracts/preferences';
import type { RevisionStatus, RevisionSummary, VeTableResource } from '@shared/contracts/tables';
import { formatQuantity } from '../../ui/units/format-quantity';

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

/**
 * The MAP span of a table's load axis in the user's units, e.g. "MAP 20–250 kPa" or
 * "MAP 2.9–36.26 psi(a)"; empty for a table without breakpoints.
 */
export function mapRangeText(
  table: Pick<VeTableResource, 'mapAxisKpa'>,
  units: UnitSystem,
): string {
  const axis = table.mapAxisKpa;
  if (axis.length === 0) return '';
  const low = formatQuantity('pressure', Math.min(...axis), units, { unit: false });
  const high = formatQuantity('pressure', Math.max(...axis), units);
  return `MAP ${low}–${high}`;
}

/** The newest `count` revisions, newest first, from a list in ascending number order. */
export function latestRevisions(
  revisions: readonly RevisionSummary[],
  count: number,
): RevisionSummary[] {
  return [...revisions].sort((a, b) => b.number - a.number).slice(0, Math.max(0, count));
}
