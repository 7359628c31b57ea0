import { EXAMPLE_HEADERS, EXAMPLE_STYLES } from '../import/example-csv';
import { CSV_DELIMITERS, CSV_HEADERS } from '../sim/csv-export';

// The simulator's three CSV styles are a contract with the import stage: its specs write the
// same styles from hand-picked samples. The two writers must agree on every header.
describe('CSV style contract between the simulator and the import stage', () => {
  it.each(EXAMPLE_STYLES)('the %s header is the same on both sides', (style) => {
    expect(CSV_HEADERS[style].join(CSV_DELIMITERS[style])).toBe(EXAMPLE_HEADERS[style]);
  });
});
