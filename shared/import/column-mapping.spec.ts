import { validateMapping, type ColumnMapping } from './column-mapping';
import { ImportError } from './import-error';

const VALID: ColumnMapping = {
  headerRow: 4,
  unitsRow: 3,
  delimiter: ';',
  decimal: ',',
  channels: {
    rpm: { column: 'Engine Speed [rpm]' },
    boost: { column: 'Boost [psig]', unit: 'psi' },
  },
};

describe('validateMapping', () => {
  it('When the mapping is the API example, then it passes', () => {
    expect(() => validateMapping(VALID)).not.toThrow();
  });

  it.each([
    ['headerRow', { ...VALID, headerRow: -1 }],
    ['unitsRow', { ...VALID, unitsRow: 4 }],
    ['delimiter', { ...VALID, delimiter: ':' }],
    ['decimal', { ...VALID, delimiter: ',', decimal: ',' }],
    ['channels.speedo', { ...VALID, channels: { speedo: { column: 'x' } } }],
    ['channels.rpm.column', { ...VALID, channels: { rpm: { column: '' } } }],
    ['channels.iat.unit', { ...VALID, channels: { iat: { column: 'IAT', unit: 'psi' } } }],
    ['channels.gear.unit', { ...VALID, channels: { gear: { column: 'Gear', unit: '%' } } }],
  ])('When %s is wrong, then the ImportError names that field', (field, mapping) => {
    expect(() => validateMapping(mapping as ColumnMapping)).toThrow(ImportError);
    expect(() => validateMapping(mapping as ColumnMapping)).toThrow(
      expect.objectContaining({ code: 'invalid_mapping', details: { field } }),
    );
  });
});
