import { ImportError } from './import-error';
import { bracketUnitText, sniffCsv } from './sniff-csv';

const lines = (...rows: string[]): string => rows.join('\n') + '\n';

describe('sniffCsv', () => {
  // Layouts written by hand; the expected rows are counted from line 0 (api.md "Column mapping").
  it.each([
    {
      name: 'comma delimiter, dot decimal, no preamble',
      text: lines('time_s,engine_rpm,map_kpa', '0.00,812,34.5', '0.05,815,34.1'),
      expected: { delimiter: ',', decimal: '.', headerRow: 0, unitsRow: null, firstDataRow: 1 },
      columns: [
        ['time_s', null],
        ['engine_rpm', null],
        ['map_kpa', null],
      ],
    },
    {
      name: 'semicolon, decimal comma, three preamble lines',
      text: lines(
        'Cellsmith simulator export',
        'Vehicle: Demo coupe',
        'Started: 2024-05-04T09:30:00Z',
        'Time [ms];Engine Speed [rpm];Boost [psig]',
        '0;812;-9,5',
        '50;815;-9,4',
      ),
      expected: { delimiter: ';', decimal: ',', headerRow: 3, unitsRow: null, firstDataRow: 4 },
      columns: [
        ['Time [ms]', 'ms'],
        ['Engine Speed [rpm]', 'rpm'],
        ['Boost [psig]', 'psig'],
      ],
    },
    {
      name: 'tab with a units row under the header',
      text: lines('Time\tRPM\tMAP\tCL', 's\trpm\tbar\t', '0.0\t800\t0.35\t1', '0.1\t805\t0.36\t1'),
      expected: { delimiter: '\t', decimal: '.', headerRow: 0, unitsRow: 1, firstDataRow: 2 },
      columns: [
        ['Time', 's'],
        ['RPM', 'rpm'],
        ['MAP', 'bar'],
        ['CL', null],
      ],
    },
    {
      name: 'units row above the header, blank lines and key: value preamble',
      text: lines(
        'Log of: test cell',
        '',
        'rate: 20 Hz',
        's|rpm|kPa',
        'Time|RPM|MAP',
        '',
        '0|800|35',
      ),
      expected: { delimiter: '|', decimal: '.', headerRow: 4, unitsRow: 3, firstDataRow: 6 },
      columns: [
        ['Time', 's'],
        ['RPM', 'rpm'],
        ['MAP', 'kPa'],
      ],
    },
    {
      name: 'semicolon with dot decimals and CRLF line breaks',
      text: 'a;b;c\r\n1.5;2.5;3\r\n2.5;3.5;4\r\n',
      expected: { delimiter: ';', decimal: '.', headerRow: 0, unitsRow: null, firstDataRow: 1 },
      columns: [
        ['a', null],
        ['b', null],
        ['c', null],
      ],
    },
  ])('When the file is $name, then the layout is found', ({ text, expected, columns }) => {
    const sniff = sniffCsv(text);
    expect(sniff).toMatchObject(expected);
    expect(sniff.columns.map((c) => [c.name, c.unit])).toEqual(columns);
    expect(sniff.columns.map((c) => c.index)).toEqual(columns.map((_, i) => i));
  });

  it('When the text is cut in the middle of a line, then that line is not used', () => {
    const head = 'a;b;c\n1;2;3\n4;5'; // the last line was cut off
    const sniff = sniffCsv(head, { isTruncated: true });
    expect(sniff.sampleRows).toEqual([['1', '2', '3']]);
  });

  it('When quoted fields hold the delimiter, then they stay one column', () => {
    const sniff = sniffCsv(lines('"Time, s",RPM', '0,800', '1,810'));
    expect(sniff.columns.map((c) => c.name)).toEqual(['Time, s', 'RPM']);
  });

  it.each([
    ['numbers only', lines('0,1,2', '3,4,5'), 'no_header'],
    ['a header and no data', lines('Title', 'time,rpm,map'), 'no_data'],
    ['one column of text', lines('hello', 'world'), 'no_header'],
    ['nothing', '', 'no_header'],
  ])('When the file holds %s, then an ImportError says %s', (_name, text, code) => {
    expect(() => sniffCsv(text)).toThrow(ImportError);
    try {
      sniffCsv(text);
    } catch (error) {
      expect((error as ImportError).code).toBe(code);
    }
  });

  it('When headText is not a string, then the error names it', () => {
    expect(() => sniffCsv(42 as unknown as string)).toThrow(/headText/);
  });
});

describe('bracketUnitText', () => {
  it.each([
    ['Boost [psig]', 'psig'],
    ['Boost (psig)', 'psig'],
    ['Intake Air Temp [F]', 'F'],
    ['Gear', null],
    ['Air/Fuel [ AFR ]', 'AFR'],
  ])('%s → %s', (name, unit) => {
    expect(bracketUnitText(name)).toBe(unit);
  });
});
