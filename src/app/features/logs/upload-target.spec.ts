import type { RevisionSummary, VeTableResource } from '@shared/contracts/tables';
import { revisionGroups, revisionLabel } from './upload-target';

/** A revision summary with the given fields. */
function revision(fields: Partial<RevisionSummary>): RevisionSummary {
  return {
    id: 'r',
    tableId: 't1',
    parentId: null,
    number: 1,
    status: 'draft',
    message: '',
    authorId: 'u',
    authorName: 'Tom',
    analysisId: null,
    createdAt: '2026-03-01T10:00:00.000Z',
    ...fields,
  };
}

const TABLE: VeTableResource = {
  id: 't1',
  vehicleId: 'v1',
  name: 'Main VE',
  rpmAxis: [1000, 2000],
  mapAxisKpa: [40, 100],
  headRevisionId: 'r2',
  createdAt: '2026-03-01T10:00:00.000Z',
};

describe('upload target', () => {
  it.each<[Partial<RevisionSummary>, string]>([
    [{ number: 3, status: 'approved', message: 'Leaner cruise' }, 'r3 · approved · Leaner cruise'],
    [{ number: 1, status: 'draft', message: '  ' }, 'r1 · draft · no message'],
    [{ number: 2, status: 'sent_back', message: 'a\nb' }, 'r2 · sent back · a b'],
    [
      { number: 4, status: 'in_review', message: 'x'.repeat(80) },
      `r4 · in review · ${'x'.repeat(59)}…`,
    ],
  ])('When the revision is %p, then its label is %p', (fields, label) => {
    expect(revisionLabel(revision(fields))).toBe(label);
  });

  it('When a vehicle has tables, then each lists its revisions newest first; empty tables drop out', () => {
    const groups = revisionGroups([
      {
        table: TABLE,
        revisions: [revision({ id: 'r1', number: 1 }), revision({ id: 'r2', number: 2 })],
      },
      { table: { ...TABLE, id: 't2', name: 'Spare' }, revisions: [] },
    ]);
    expect(groups).toEqual([
      {
        tableId: 't1',
        tableName: 'Main VE',
        options: [
          { id: 'r2', label: 'r2 · draft · no message' },
          { id: 'r1', label: 'r1 · draft · no message' },
        ],
      },
    ]);
  });
});
