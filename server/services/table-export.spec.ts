import { exportFileName, formatTableText } from './table-export';

describe('formatTableText', () => {
  const table = {
    rpmAxis: [500, 12000],
    mapAxisKpa: [20, 250],
    values: [
      [-0, 1234.5],
      [0.125, 300],
    ],
  };

  it('When a table has large and fractional numbers, then they print plainly', () => {
    expect(formatTableText(table, 'csv')).toBe(
      'map_kpa\\rpm,500,12000\r\n20,0,1234.5\r\n250,0.125,300\r\n',
    );
  });

  it('When the format is tsv, then tabs separate the fields', () => {
    expect(formatTableText(table, 'tsv').split('\r\n')[0]).toBe('map_kpa\\rpm\t500\t12000');
  });

  it('When formatted, then the table is unchanged', () => {
    const before = JSON.stringify(table);
    formatTableText(table, 'csv');
    expect(JSON.stringify(table)).toBe(before);
  });
});

describe('exportFileName', () => {
  it.each([
    ['Main VE / E85', 3, 'csv', 'main-ve-e85-r3.csv'],
    ['  ***  ', 1, 'tsv', 've-table-r1.tsv'],
    ['Ünïcode "quoted"', 2, 'csv', 'n-code-quoted-r2.csv'],
  ] as const)('When the table is named %j, then the file is %s', (name, n, format, expected) => {
    expect(exportFileName(name, n, format)).toBe(expected);
  });
});
