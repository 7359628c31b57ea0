import { planImport } from './plan-import';

const TEXT =
  'Logged by the bench\nTime;RPM;MAP;Lambda;Target Lambda\ns;rpm;kPa;λ;λ\n0;800;40;1;1\n';

describe('planImport', () => {
  it('When no mapping is given, then the suggestion becomes the mapping', () => {
    const plan = planImport(TEXT);
    expect(plan.mapping).toMatchObject({ headerRow: 1, unitsRow: 2, delimiter: ';', decimal: '.' });
    expect(plan.suggestion?.missing).toEqual([]);
  });

  it('When a mapping gives only channels, then the layout fields come from the sniffer', () => {
    const plan = planImport(TEXT, { channels: { time: { column: 'Time' } } });
    expect(plan.mapping).toEqual({
      headerRow: 1,
      unitsRow: 2,
      delimiter: ';',
      decimal: '.',
      channels: { time: { column: 'Time' } },
    });
    expect(plan.suggestion).toBeNull();
  });

  it('When a mapping moves the header row, then the sniffed units row is not carried over', () => {
    const plan = planImport(TEXT, { headerRow: 2, channels: { time: { column: 's' } } });
    expect(plan.mapping.unitsRow).toBeNull();
  });

  it('When gauge boost has no barometer, then options.baroKpa stands in for it', () => {
    const text = 'Time,RPM,Boost [psig],Lambda,Target Lambda\n0,800,3,1,1\n';
    expect(() => planImport(text)).toThrow(expect.objectContaining({ code: 'missing_channels' }));
    expect(planImport(text, undefined, { baroKpa: 100 }).suggestion?.missing).toEqual([]);
  });
});
