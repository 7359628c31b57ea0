import type { LogResource } from '@shared/contracts/logs';
import {
  type SummaryRow,
  displaySummaryRows,
  mappingRows,
  mergeLogRows,
  summaryRows,
  upsertLogRow,
} from './log-rows';

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

describe('displaySummaryRows', () => {
  const rows: SummaryRow[] = [
    { channel: 'map', min: 101.325, max: 200, mean: 150, nanCount: 0 },
    { channel: 'boost', min: 0, max: 100, mean: 50, nanCount: 0 },
    { channel: 'iat', min: 100, max: 100, mean: 100, nanCount: 0 },
    { channel: 'lambda', min: 0.8, max: 1, mean: null, nanCount: 3 },
    { channel: 'rpm', min: 800, max: 7000, mean: 3000, nanCount: 0 },
  ];
  const figures = (units: 'metric' | 'imperial', mixture: 'lambda' | 'afr', afr: number | null) =>
    displaySummaryRows(rows, units, mixture, afr).map((r) => [
      r.channel,
      r.unit,
      r.min === null ? null : Number(r.min.toFixed(3)),
    ]);

  it('When the user reads metric and lambda, then the figures stay as stored', () => {
    expect(figures('metric', 'lambda', 14.7)).toEqual([
      ['map', 'kPa', 101.325],
      ['boost', 'kPa gauge', 0],
      ['iat', '°C', 100],
      ['lambda', 'λ', 0.8],
      ['rpm', 'rpm', 800],
    ]);
  });

  it('When the user reads imperial and AFR, then pressure, temperature and mixture convert', () => {
    // 101.325 kPa = 14.696 psi (NIST SP 811, 2008 edition, Appendix B.8: 1 psi = 6.894757 kPa);
    // 100 °C = 212 °F (the same guide, B.9); AFR = λ·AFR_st: 0.8 × 14.7 = 11.76. Gauge boost
    // keeps kPa, as psi(a) would call it absolute.
    expect(figures('imperial', 'afr', 14.7)).toEqual([
      ['map', 'psi(a)', 14.696],
      ['boost', 'kPa gauge', 0],
      ['iat', '°F', 212],
      ['lambda', 'AFR', 11.76],
      ['rpm', 'rpm', 800],
    ]);
  });

  it('When AFR is preferred but the fuel is not known yet, then lambda is shown', () => {
    expect(figures('metric', 'afr', null)[3]).toEqual(['lambda', 'λ', 0.8]);
    expect(displaySummaryRows(rows, 'metric', 'afr', 14.7)[3]?.mean).toBeNull();
  });
});
