import type { LogResource } from '@shared/contracts/logs';
import { mappingRows, mergeLogRows, summaryRows, upsertLogRow } from './log-rows';

/** A log with only the fields the rows look at filled in. */
function log(id: string, createdAt: string): LogResource {
  return { id, createdAt } as LogResource;
}

describe('mergeLogRows', () => {
  it('When two vehicles have logs, then all come newest first with their vehicle', () => {
    const rows = mergeLogRows([
      {
        vehicleLabel: 'A',
        logs: [log('a2', '2025-03-02T00:00:00Z'), log('a1', '2025-01-01T00:00:00Z')],
      },
      { vehicleLabel: 'B', logs: [log('b1', '2025-02-01T00:00:00Z')] },
    ]);
    expect(rows.map((row) => `${row.vehicleLabel}:${row.log.id}`)).toEqual([
      'A:a2',
      'B:b1',
      'A:a1',
    ]);
  });
});

describe('upsertLogRow', () => {
  const rows = mergeLogRows([{ vehicleLabel: 'A', logs: [log('a1', '2025-01-01T00:00:00Z')] }]);
  it.each([
    ['a new log', log('n', '2025-05-01T00:00:00Z'), ['n', 'a1']],
    ['a known log', log('a1', '2025-01-01T00:00:00Z'), ['a1']],
  ])('When %s arrives, then the list holds it once, newest first', (_case, incoming, ids) => {
    expect(upsertLogRow(rows, incoming, 'A').map((row) => row.log.id)).toEqual(ids);
  });
});

describe('mappingRows and summaryRows', () => {
  it('When a log maps and summarises channels, then they come in canonical order', () => {
    const mapping = {
      channels: {
        lambda: { column: 'lambda_measured' },
        rpm: { column: 'engine_rpm', unit: 'rpm' },
      },
    } as LogResource['mapping'];
    expect(mappingRows(mapping)).toEqual([
      { channel: 'rpm', column: 'engine_rpm', unit: 'rpm' },
      { channel: 'lambda', column: 'lambda_measured', unit: null },
    ]);
    const figures = { min: 1, max: 2, mean: 1.5, nanCount: 0 };
    expect(summaryRows({ map: figures, time: figures }).map((row) => row.channel)).toEqual([
      'time',
      'map',
    ]);
    expect(summaryRows(null)).toEqual([]);
  });
});
