import type { RevisionStatus, RevisionSummary, VeTableResource } from '@shared/contracts/tables';

/** One revision to pick as the one the ECU ran. */
export interface RevisionOption {
  /** The revision's id. */
  readonly id: string;
  /** "r3 · approved · Leaner cruise" */
  readonly label: string;
}

/** A table's revisions, newest first. */
export interface RevisionGroup {
  /** The table's id. */
  readonly tableId: string;
  /** The table's name. */
  readonly tableName: string;
  /** Its revisions, newest first. */
  readonly options: readonly RevisionOption[];
}

/** Review states in words. */
const STATUS_TEXT: Readonly<Record<RevisionStatus, string>> = {
  draft: 'draft',
  in_review: 'in review',
  approved: 'approved',
  sent_back: 'sent back',
};

/** Longest message shown in an option before it is cut with an ellipsis. */
const MESSAGE_CHARS = 60;

/** "number · status · message" of a revision, the message cut to fit a menu. */
export function revisionLabel(revision: RevisionSummary): string {
  const message = revision.message.trim().replace(/\s+/g, ' ');
  const shown =
    message === ''
      ? 'no message'
      : message.length > MESSAGE_CHARS
        ? `${message.slice(0, MESSAGE_CHARS - 1)}…`
        : message;
  return `r${revision.number} · ${STATUS_TEXT[revision.status]} · ${shown}`;
}

/** A vehicle's tables with their revisions, as groups for the ECU revision select. */
export function revisionGroups(
  tables: readonly { table: VeTableResource; revisions: readonly RevisionSummary[] }[],
): RevisionGroup[] {
  return tables
    .filter(({ revisions }) => revisions.length > 0)
    .map(({ table, revisions }) => ({
      tableId: table.id,
      tableName: table.name,
      options: [...revisions]
        .sort((a, b) => b.number - a.number)
        .map((revision) => ({ id: revision.id, label: revisionLabel(revision) })),
    }));
}
