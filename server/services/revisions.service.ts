import { compareTables } from '../../shared/compare';
import type {
  AppliedRecord,
  CompareRevisionsQuery,
  CreateRevisionRequest,
  ExportRevisionQuery,
  Revision,
  RevisionComparison,
  VeTableResource,
} from '../../shared/contracts/tables';
import { validateTable } from '../../shared/core/table';
import type { Database, Executor } from '../db';
import { conflict, notFound } from '../errors/app-error';
import { invalidInput } from '../errors/invalid-input';
import { recordAudit } from '../repositories/audit.repository';
import {
  findLastRevisionNumber,
  findRevision,
  insertRevision,
} from '../repositories/revisions.repository';
import { findTable, setHeadRevision } from '../repositories/tables.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { exportContentType, exportFileName, formatTableText } from './table-export';

/** A revision rendered as a file to download. */
export interface RevisionFile {
  /** The name the browser saves it under. */
  fileName: string;
  /** The Content-Type header. */
  contentType: string;
  /** The file's text. */
  text: string;
}

/** One revision of the actor's shop with its values; 404 when it is not there. */
export async function getRevision(
  db: Database,
  actor: SessionUserRecord,
  id: string,
): Promise<Revision> {
  const revision = await findRevision(db, actor.shopId, id);
  if (!revision) throw notFound('Revision');
  return revision;
}

/**
 * Adds a draft revision to a table of the actor's shop and makes it the table's head. The table
 * row is locked for the transaction, so concurrent revisions get numbers one after another
 * (the unique index on table and number stays the last guard). The parent may be any revision
 * of this table: starting again from an older one is allowed.
 */
export function addRevision(
  db: Database,
  actor: SessionUserRecord,
  tableId: string,
  body: CreateRevisionRequest,
  options: { analysisId?: string; applied?: AppliedRecord } = {},
): Promise<Revision> {
  return db.transaction(async (tx) => {
    const table = await findTable(tx, actor.shopId, tableId, { forUpdate: true });
    if (!table) throw notFound('Table');
    const parent = await findRevision(tx, actor.shopId, body.parentId);
    if (!parent) throw notFound('Parent revision');
    if (parent.tableId !== table.id) {
      throw conflict('parentId is a revision of another table', { parentId: body.parentId });
    }
    try {
      validateTable({ ...table, values: body.values }, 'table');
    } catch (err) {
      throw invalidInput('body.values', err instanceof Error ? err.message : String(err));
    }
    const number = (await findLastRevisionNumber(tx, actor.shopId, table.id)) + 1;
    const id = await insertRevision(tx, actor.shopId, {
      tableId: table.id,
      parentId: parent.id,
      number,
      values: body.values,
      message: body.message,
      authorId: actor.id,
      analysisId: options.analysisId ?? null,
      applied: options.applied ?? null,
    });
    await setHeadRevision(tx, actor.shopId, table.id, id);
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'revision.created',
      targetType: 'revision',
      targetId: id,
      details: { tableId: table.id, number, parentId: parent.id, analysisId: options.analysisId },
    });
    const created = await findRevision(tx, actor.shopId, id);
    if (!created) throw new Error('addRevision: the new revision is missing');
    return created;
  });
}

/** The table a revision of the shop belongs to (revisions never outlive their table). */
async function tableOf(db: Executor, shopId: string, revision: Revision): Promise<VeTableResource> {
  const table = await findTable(db, shopId, revision.tableId);
  if (!table) throw notFound('Table');
  return table;
}

/** A revision of the actor's shop as a CSV or TSV file; 404 when it is not there. */
export async function exportRevision(
  db: Database,
  actor: SessionUserRecord,
  id: string,
  format: ExportRevisionQuery['format'],
): Promise<RevisionFile> {
  const revision = await getRevision(db, actor, id);
  const table = await tableOf(db, actor.shopId, revision);
  return {
    fileName: exportFileName(table.name, revision.number, format),
    contentType: exportContentType(format),
    text: formatTableText({ ...table, values: revision.values }, format),
  };
}

function isSameAxis(x: readonly number[], y: readonly number[]): boolean {
  return x.length === y.length && x.every((value, i) => value === y[i]);
}

/**
 * Compares revision `b` against revision `a`, both of the actor's shop (404 for either one
 * missing). Revisions of different tables compare only when the axes are the same (409
 * otherwise): a cell-by-cell difference means nothing across different breakpoints.
 */
export async function compareRevisions(
  db: Database,
  actor: SessionUserRecord,
  query: CompareRevisionsQuery,
): Promise<RevisionComparison> {
  const a = await findRevision(db, actor.shopId, query.a);
  if (!a) throw notFound('Revision a');
  const b = await findRevision(db, actor.shopId, query.b);
  if (!b) throw notFound('Revision b');
  const tableA = await tableOf(db, actor.shopId, a);
  const tableB = a.tableId === b.tableId ? tableA : await tableOf(db, actor.shopId, b);
  if (
    !isSameAxis(tableA.rpmAxis, tableB.rpmAxis) ||
    !isSameAxis(tableA.mapAxisKpa, tableB.mapAxisKpa)
  ) {
    throw conflict('The two revisions belong to tables with different axes', {
      tableIds: [tableA.id, tableB.id],
    });
  }
  const result = compareTables({ ...tableA, values: a.values }, { ...tableB, values: b.values });
  return {
    a,
    b,
    diff: { absolute: result.absolute, percent: result.percent },
    summary: { ...result.summary },
  };
}
