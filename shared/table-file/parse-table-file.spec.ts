import { createTableRequestSchema, MAX_BREAKPOINTS, MAX_VE, MIN_VE } from '../contracts/tables';
import { KPA_PER_BAR, KPA_PER_PSI, toKpa } from '../units/units';
import {
  parseTableFile,
  TABLE_FILE_MAX_BREAKPOINTS,
  TABLE_FILE_MAX_VE,
  TABLE_FILE_MIN_VE,
  type ParseTableFileOptions,
  type TableFileResult,
} from './parse-table-file';
import { isTableFileError, TableFileError, type TableFileErrorDetails } from './table-file-error';

// Literal outputs of formatTableText (server/services/table-export.ts) for the table below,
// printed once from that function; shared/ may not import server code, so the text is copied.
const EXPORT_CSV =
  'map_kpa\\rpm,800,2000,4000,6500\r\n30,45.25,50,52.5,48\r\n60,55,61.75,66,63.5\r\n' +
  '100,70,82.1,88.05,85\r\n';
const EXPORT_TSV =
  'map_kpa\\rpm\t800\t2000\t4000\t6500\r\n30\t45.25\t50\t52.5\t48\r\n60\t55\t61.75\t66\t63.5\r\n' +
  '100\t70\t82.1\t88.05\t85\r\n';
const EXPORTED = {
  rpmAxis: [800, 2000, 4000, 6500],
  mapAxisKpa: [30, 60, 100],
  values: [
    [45.25, 50, 52.5, 48],
    [55, 61.75, 66, 63.5],
    [70, 82.1, 88.05, 85],
  ],
};

/** A small table in our export's layout, written with the given separator and decimal mark. */
function ourTable(separator: string, decimal: '.' | ',' = '.', eol = '\n'): string {
  const rows = [
    ['map_kpa\\rpm', '1000', '3000', '5000'],
    ['40', '50.5', '60', '58.25'],
    ['100', '80', '92.5', '90'],
  ];
  return rows
    .map((r) => r.map((cell) => (decimal === ',' ? cell.replace('.', ',') : cell)).join(separator))
    .join(eol);
}

const OUR_TABLE = {
  rpmAxis: [1000, 3000, 5000],
  mapAxisKpa: [40, 100],
  values: [
    [50.5, 60, 58.25],
    [80, 92.5, 90],
  ],
};

function axesAndValues(
  result: TableFileResult,
): Pick<TableFileResult, 'rpmAxis' | 'mapAxisKpa' | 'values'> {
  return { rpmAxis: result.rpmAxis, mapAxisKpa: result.mapAxisKpa, values: result.values };
}

/** The error `parse` throws; fails the test when it throws none or another kind. */
function errorOf(text: string, options?: ParseTableFileOptions): TableFileError {
  try {
    parseTableFile(text, options);
  } catch (err) {
    if (err instanceof TableFileError) return err;
    throw err;
  }
  throw new Error('expected a TableFileError, but the file was accepted');
}

function expectError(
  text: string,
  code: TableFileError['code'],
  where: TableFileErrorDetails,
  options?: ParseTableFileOptions,
): TableFileError {
  const error = errorOf(text, options);
  expect(error.code).toBe(code);
  expect({ row: error.row, column: error.column }).toEqual({
    row: where.row,
    column: where.column,
  });
  if (where.axis !== undefined) expect(error.axis).toBe(where.axis);
  if (where.index !== undefined) expect(error.index).toBe(where.index);
  expect(error.message.length).toBeGreaterThan(20);
  return error;
}

describe('parseTableFile: our export', () => {
  it('When our CSV export (CRLF) is read, then axes and values come back exactly', () => {
    const result = parseTableFile(EXPORT_CSV);
    expect(axesAndValues(result)).toEqual(EXPORTED);
    expect(result.orientation).toBe('map-rows');
    expect(result.pressureUnit).toBe('kPa');
    expect(result.delimiter).toBe(',');
    expect(result.warnings).toEqual([]);
  });

  it('When our TSV export is read, then it is the same table', () => {
    const result = parseTableFile(EXPORT_TSV);
    expect(axesAndValues(result)).toEqual(EXPORTED);
    expect(result.delimiter).toBe('\t');
  });

  it('When our export has LF line ends, then it reads as with CRLF', () => {
    expect(axesAndValues(parseTableFile(EXPORT_CSV.replace(/\r\n/g, '\n')))).toEqual(EXPORTED);
  });

  it('When the result is sent as a new table, then the API schema accepts it as is', () => {
    const { rpmAxis, mapAxisKpa, values } = parseTableFile(EXPORT_CSV);
    const parsed = createTableRequestSchema.safeParse({ name: 'VE', rpmAxis, mapAxisKpa, values });
    expect(parsed.success).toBe(true);
  });

  it('When the parser limits are compared with the API contract, then they agree', () => {
    expect([TABLE_FILE_MIN_VE, TABLE_FILE_MAX_VE, TABLE_FILE_MAX_BREAKPOINTS]).toEqual([
      MIN_VE,
      MAX_VE,
      MAX_BREAKPOINTS,
    ]);
  });
});

describe('parseTableFile: separators and decimal marks', () => {
  it.each([
    ['comma', ','],
    ['semicolon', ';'],
    ['tab', '\t'],
  ])('When the cells are separated by a %s, then the separator is found', (_name, separator) => {
    const result = parseTableFile(ourTable(separator));
    expect(result.delimiter).toBe(separator);
    expect(result.decimal).toBe('.');
    expect(axesAndValues(result)).toEqual(OUR_TABLE);
  });

  it.each([
    ['semicolon', ';'],
    ['tab', '\t'],
  ])('When numbers use a decimal comma with a %s, then they are read', (_name, separator) => {
    const result = parseTableFile(ourTable(separator, ',', '\r\n'));
    expect(result.delimiter).toBe(separator);
    expect(result.decimal).toBe(',');
    expect(axesAndValues(result)).toEqual(OUR_TABLE);
  });

  it('When a decimal-comma file writes a point in a breakpoint, then that cell is refused', () => {
    const text = 'map_kpa\\rpm;1.000;3000;5000\n40;50,5;60;58\n100;80;92,5;90';
    const error = expectError(text, 'not_a_number', { row: 0, column: 1 });
    expect(error.message).toContain('1.000');
  });
});

describe('parseTableFile: orientation', () => {
  const transposed = 'rpm\\map_kpa,40,100\n1000,50.5,80\n3000,60,92.5\n5000,58.25,90\n';

  it('When RPM runs down the rows, then auto turns it to MAP rows and says why', () => {
    const result = parseTableFile(transposed);
    expect(axesAndValues(result)).toEqual(OUR_TABLE);
    expect(result.orientation).toBe('rpm-rows');
    expect(result.orientationReason).toContain('5000');
  });

  it('When the corner cell is empty, then the numbers alone decide', () => {
    const result = parseTableFile(transposed.replace('rpm\\map_kpa', ''));
    expect(result.orientation).toBe('rpm-rows');
    expect(result.orientationReason).toMatch(/engine speeds/);
  });

  it('When the corner label disagrees with the numbers, then the numbers win and it warns', () => {
    const result = parseTableFile(transposed.replace('rpm\\map_kpa', 'map_kpa\\rpm'));
    expect(result.orientation).toBe('rpm-rows');
    expect(result.warnings.join(' ')).toContain('corner cell');
  });

  // Both axes below 1000: only the corner label tells, so auto follows it; a forced
  // orientation overrides that choice.
  const lowRpm = 'map_kpa\\rpm,500,700,900\n20,40,45,50\n60,55,60,65\n';

  it('When the numbers do not tell, then auto follows the corner label', () => {
    const result = parseTableFile(lowRpm);
    expect(result.orientation).toBe('map-rows');
    expect(result.rpmAxis).toEqual([500, 700, 900]);
    expect(result.orientationReason).toContain('corner cell');
  });

  it('When the caller forces the orientation, then it overrides auto and warns', () => {
    const result = parseTableFile(lowRpm, { orientation: 'rpm-rows' });
    expect(result.orientation).toBe('rpm-rows');
    expect(result.rpmAxis).toEqual([20, 60]);
    expect(result.mapAxisKpa).toEqual([500, 700, 900]);
    expect(result.values).toEqual([
      [40, 55],
      [45, 60],
      [50, 65],
    ]);
    expect(result.warnings.join(' ')).toContain('as asked');
  });

  it('When neither numbers nor labels tell the axes apart, then the caller is asked', () => {
    const error = expectError(lowRpm.replace('map_kpa\\rpm', ''), 'ambiguous_orientation', {
      row: 0,
      column: 0,
    });
    expect(error.message).toContain('Choose the orientation');
  });
});

describe('parseTableFile: labels, units and pressure', () => {
  it('When a title line sits above the table, then it is skipped and kept as the title', () => {
    const result = parseTableFile(`Main fuel VE, engine 2\n${ourTable(',')}`);
    expect(axesAndValues(result)).toEqual(OUR_TABLE);
    expect(result.title).toBe('Main fuel VE, engine 2');
  });

  it('When a label line holds a number of its own, then it is still a label', () => {
    const result = parseTableFile(`Engine;2\n${ourTable(';')}`);
    expect(axesAndValues(result)).toEqual(OUR_TABLE);
    expect(result.title).toBe('Engine; 2');
  });

  it('When a units row in psi follows the header, then MAP is converted to kPa', () => {
    const text = ';1000;3000;5000\npsi;rpm;rpm;rpm\n5;50;60;58\n14,5;80;92,5;90\n';
    const result = parseTableFile(text);
    expect(result.pressureUnit).toBe('psi');
    expect(result.mapAxisKpa).toEqual([toKpa(5, 'psi'), toKpa(14.5, 'psi')]);
    // 1 psi = 6.894757 kPa: NIST SP 811 App. B.8, 6.894757E+03 Pa (from memory of NIST SP 811,
    // as in tests/reference/units.reference.spec.ts) [S*]
    expect(result.mapAxisKpa[0]).toBeCloseTo(5 * 6.894757, 5);
    expect(result.mapAxisKpa[1]).toBeCloseTo(14.5 * KPA_PER_PSI, 12);
    expect(result.warnings.join(' ')).toContain('converted from psi');
  });

  it('When a bar units row sits above a transposed header, then MAP is in kPa', () => {
    const text = 'rpm\tbar\tbar\n\t0,4\t1,8\n1000\t50\t80\n6000\t60\t95\n';
    const result = parseTableFile(text);
    expect(result.orientation).toBe('rpm-rows');
    expect(result.pressureUnit).toBe('bar');
    // 1 bar = 100 kPa exactly, by definition (NIST SP 811 App. B.8, from memory) [S*]
    expect(result.mapAxisKpa[0]).toBeCloseTo(40, 12);
    expect(result.mapAxisKpa[1]).toBeCloseTo(1.8 * KPA_PER_BAR, 12);
    expect(result.values).toEqual([
      [50, 60],
      [80, 95],
    ]);
  });

  it('When the corner label names psi, then the MAP axis is read in psi', () => {
    const result = parseTableFile('MAP (psi)\\rpm,1000,4000\n5,40,50\n20,70,90\n');
    expect(result.pressureUnit).toBe('psi');
    expect(result.mapAxisKpa[1]).toBeCloseTo(20 * KPA_PER_PSI, 12);
  });

  it('When the axis tops out at 30 with no unit, then the caller is asked for the unit', () => {
    const text = ',1000,3000\n10,50,60\n30,80,90\n';
    const error = expectError(text, 'ambiguous_pressure_unit', { row: 1, column: 0, axis: 'map' });
    expect(error.message).toContain('Say which unit');
  });

  it('When the caller says kPa for such a small axis, then it stays kPa and warns', () => {
    const result = parseTableFile(',1000,3000\n10,50,60\n30,80,90\n', { pressureUnit: 'kPa' });
    expect(result.mapAxisKpa).toEqual([10, 30]);
    expect(result.warnings.join(' ')).toContain('psi or bar');
  });

  it('When the caller names bar for a file without units, then MAP is converted', () => {
    const result = parseTableFile(',1000,3000\n0.3,50,60\n2.5,80,90\n', { pressureUnit: 'bar' });
    expect(result.mapAxisKpa).toEqual([30, 250]);
  });

  it('When the caller names another unit than the file, then the caller wins and it warns', () => {
    const text = 'kPa,rpm\nmap_kpa\\rpm,1000,3000\n1,50,60\n2,80,90\n';
    const result = parseTableFile(text, { pressureUnit: 'bar' });
    expect(result.mapAxisKpa).toEqual([100, 200]);
    expect(result.warnings[0]).toBe(
      'The MAP axis was read in bar as asked, though the units row (row 0) names kPa.',
    );
  });

  it('When the file names no unit and the axis is plainly kPa, then kPa is used and noted', () => {
    const result = parseTableFile(',1000,3000\n30,50,60\n100,80,90\n');
    expect(result.pressureUnit).toBe('kPa');
    expect(result.warnings.join(' ')).toContain('no pressure unit');
  });

  it('When the units row gives gauge pressure, then the file is refused', () => {
    const text = ',1000,3000\npsig,rpm,rpm\n0,50,60\n10,80,90\n';
    expectError(text, 'gauge_pressure', { row: 1, column: undefined });
  });
});

describe('parseTableFile: whitespace and padding', () => {
  it('When lines carry spaces and the file ends in blank lines, then they are ignored', () => {
    const text =
      '  map_kpa\\rpm , 1000 ,3000, 5000  \n 40, 50.5 ,60,58.25\n100,80,92.5,90   \n\n  \n\n';
    expect(axesAndValues(parseTableFile(text))).toEqual(OUR_TABLE);
  });

  it('When a spreadsheet pads every line with separators, then the padding is ignored', () => {
    const text =
      'VE;;;;\r\nmap_kpa\\rpm;1000;3000;5000;\r\n40;50,5;60;58,25;\r\n100;80;92,5;90;\r\n';
    expect(axesAndValues(parseTableFile(text))).toEqual(OUR_TABLE);
  });
});

describe('parseTableFile: refused files name the row and column', () => {
  it.each([
    ['empty', ''],
    ['blank', ' \r\n\n\t\n'],
  ])('When the file is %s, then it is refused as empty', (_name, text) => {
    const error = expectError(text, 'empty_file', {});
    expect(isTableFileError(error)).toBe(true);
  });

  it('When the file is a single header row, then too few breakpoints are reported', () => {
    const error = expectError('map_kpa\\rpm,1000,3000,5000\n', 'too_few_breakpoints', {
      row: 0,
      column: 0,
    });
    expect(error.message).toContain('first column');
  });

  it('When the header holds one breakpoint, then too few breakpoints are reported there', () => {
    expectError('map_kpa\\rpm,1000\n40,50\n100,80\n', 'too_few_breakpoints', { row: 0, column: 1 });
  });

  it('When a row is short, then it is refused with its cell count', () => {
    const text = `${ourTable(',')}\n120,85,95\n`;
    const error = expectError(text, 'ragged_row', { row: 3, column: 3 });
    expect(error.message).toContain('3 cells');
    expect(error.message).toContain('4');
  });

  it('When a row is long, then it is refused at its first extra cell', () => {
    const text = 'map_kpa\\rpm;1000;3000\n40;50;60;70\n100;80;90\n';
    expectError(text, 'ragged_row', { row: 1, column: 3 });
  });

  it('When a value cell holds text, then its row and column are named', () => {
    const text = 'title\nmap_kpa\\rpm,1000,3000,5000\n40,50.5,n/a,58\n100,80,92.5,90\n';
    const error = expectError(text, 'not_a_number', { row: 2, column: 2 });
    expect(error.message).toContain('"n/a"');
  });

  it('When a value cell is empty, then its row and column are named', () => {
    expectError('map_kpa\\rpm,1000,3000\n40,,60\n100,80,90\n', 'empty_cell', { row: 1, column: 1 });
  });

  it('When an RPM breakpoint repeats, then the axis and index are named', () => {
    const text = 'map_kpa\\rpm,1000,3000,3000\n40,50,60,61\n100,80,90,91\n';
    expectError(text, 'duplicate_breakpoint', { row: 0, column: 3, axis: 'rpm', index: 2 });
  });

  it('When MAP breakpoints fall, then the axis and index are named', () => {
    const text = 'map_kpa\\rpm,1000,3000\n100,80,90\n40,50,60\n120,85,95\n';
    expectError(text, 'falling_breakpoint', { row: 2, column: 0, axis: 'map', index: 1 });
  });

  it('When a transposed RPM axis falls, then the error points down the first column', () => {
    const text = 'rpm\\map_kpa,40,100\n3000,60,92\n1000,50,80\n';
    expectError(text, 'falling_breakpoint', { row: 2, column: 0, axis: 'rpm', index: 1 });
  });

  it.each([
    ['0', 0],
    ['350', 350],
  ])('When a value is %s %%, then it is refused as out of range', (cell) => {
    const text = `map_kpa\\rpm,1000,3000\n40,50,60\n100,80,${cell}\n`;
    expectError(text, 'value_out_of_range', { row: 2, column: 2 });
  });

  it('When the header has no corner cell, then the missing corner is named', () => {
    const text = '1000,3000,5000\n40,50,60,58\n100,80,92,90\n';
    const error = expectError(text, 'missing_header', { row: 0, column: 0 });
    expect(error.message).toContain('no corner cell');
  });

  it('When the file has no header row at all, then it is refused', () => {
    expectError('40,50,60,58\n100,80,92,90\n', 'missing_header', { row: 0, column: 0 });
  });

  it('When no line is a table, then it is refused', () => {
    expectError('just some notes\nabout a car\n', 'no_table', {});
  });

  it('When an axis has more breakpoints than the API takes, then the first extra is named', () => {
    const rpm = Array.from({ length: 65 }, (_, i) => 500 + 100 * i);
    const row = (map: number): string => [map, ...rpm.map(() => 80)].join(',');
    const text = [['map_kpa\\rpm', ...rpm].join(','), row(40), row(100)].join('\n');
    expectError(text, 'too_many_breakpoints', { row: 0, column: 65 });
  });

  it('When a MAP breakpoint is beyond what the API takes, then it is refused', () => {
    const text = 'map_kpa\\rpm,1000,3000\n0,50,60\n100,80,90\n';
    expectError(text, 'axis_out_of_range', { row: 1, column: 0, axis: 'map', index: 0 });
  });
});
