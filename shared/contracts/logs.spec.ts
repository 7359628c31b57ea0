import { columnMappingSchema, uploadLogFieldsSchema } from './logs';

describe('log contracts', () => {
  it('accepts the API’s example mapping and refuses a unit its channel does not take', () => {
    const example = {
      headerRow: 4,
      unitsRow: 3,
      delimiter: ';',
      decimal: ',',
      channels: {
        rpm: { column: 'Engine Speed [rpm]' },
        boost: { column: 'Boost [psig]', unit: 'psi' },
        baro: { column: 'Barometer [inHg]', unit: 'inHg' },
        lambda: { column: 'Air/Fuel [AFR]', unit: 'afr' },
      },
    };
    expect(columnMappingSchema.safeParse(example).success).toBe(true);
    const wrong = columnMappingSchema.safeParse({
      channels: { iat: { column: 'IAT', unit: 'psi' } },
    });
    expect(wrong.success).toBe(false);
    expect(wrong.error?.issues[0]?.path).toEqual(['channels', 'iat', 'unit']);
  });

  it('refuses unknown channels, fields and a decimal comma with a comma delimiter', () => {
    expect(columnMappingSchema.safeParse({ channels: { boostPsi: { column: 'b' } } }).success).toBe(
      false,
    );
    expect(columnMappingSchema.safeParse({ channels: {}, sheet: 1 }).success).toBe(false);
    const clash = columnMappingSchema.safeParse({ delimiter: ',', decimal: ',', channels: {} });
    expect(clash.error?.issues[0]?.path).toEqual(['decimal']);
  });

  it('reads upload fields as form text: JSON mapping, kind defaulting to road, blanks absent', () => {
    const parsed = uploadLogFieldsSchema.parse({
      mapping: '{"channels":{"rpm":{"column":"RPM"}}}',
      ecuRevisionId: '',
    });
    expect(parsed).toEqual({ mapping: { channels: { rpm: { column: 'RPM' } } }, kind: 'road' });
    expect(uploadLogFieldsSchema.safeParse({ mapping: '{nope' }).success).toBe(false);
    expect(uploadLogFieldsSchema.safeParse({ kind: 'track' }).success).toBe(false);
    expect(uploadLogFieldsSchema.safeParse({ ecuRevisionId: '12' }).success).toBe(false);
  });
});
