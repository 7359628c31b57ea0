import fc from 'fast-check';
import { STOICH_AFR } from '../units';
import { EXAMPLE_STYLES, exampleCsv, type ExampleSample } from './example-csv';
import { createLogBuilder } from './log-builder';
import { createCsvImporter } from './csv-importer';
import { createPapaChunkHandler, parseCsvChunks, parseCsvText } from './parse-csv-text';

const OPTIONS = { stoichAfr: STOICH_AFR.gasoline };

function samples(count: number): ExampleSample[] {
  return Array.from({ length: count }, (_, i) => ({
    timeS: 12 + i * 0.05,
    rpm: 1500 + 10 * i,
    mapKpa: 60 + (i % 90),
    lambda: 0.9 + (i % 7) * 0.02,
    lambdaTarget: 0.8 + (i % 3) * 0.1,
    iatC: 25 + (i % 4),
    ectC: 85,
    tps: 30,
    stft: -1.5,
    ltft: 2,
    closedLoop: (i % 2) as 0 | 1,
    fuelCut: 0,
    gear: 3,
    speedKph: 70,
    knockDeg: 0,
    injDuty: 35,
  }));
}

describe('parseCsvText on the simulator styles', () => {
  const source = samples(40);

  it.each(EXAMPLE_STYLES)(
    'When a %s file is imported, then the samples come back in canonical units',
    (style) => {
      const { log, problems, stats, suggestion } = parseCsvText(
        exampleCsv(style, source),
        undefined,
        OPTIONS,
      );
      expect(problems).toEqual([]);
      expect(stats.rowsKept).toBe(40);
      expect(stats.blankRows).toBe(0);
      expect(suggestion?.missing).toEqual([]);
      const at = (channel: keyof typeof log.channels, i: number) =>
        log.channels[channel]?.[i] as number;
      source.forEach((s, i) => {
        expect(at('time', i)).toBeCloseTo(s.timeS, 3);
        expect(at('rpm', i)).toBe(s.rpm);
        // The files round values to 4–5 significant digits, hence the tolerances.
        expect(at('map', i)).toBeCloseTo(s.mapKpa, 2);
        expect(at('lambda', i)).toBeCloseTo(s.lambda, 3);
        expect(at('lambdaTarget', i)).toBeCloseTo(s.lambdaTarget, 4);
        expect(at('iat', i)).toBeCloseTo(s.iatC, 2);
        expect(at('closedLoop', i)).toBe(s.closedLoop);
      });
      expect(log.channels.boost).toBeUndefined();
    },
  );

  it('When the bracketed file is imported, then speed and baro are in km/h and kPa', () => {
    const { log } = parseCsvText(exampleCsv('bracketed', source), undefined, OPTIONS);
    expect(log.channels.speed?.[0]).toBeCloseTo(70, 2);
    expect(log.channels.baro?.[0]).toBeCloseTo(101.325, 2);
  });

  it('When an explicit mapping leaves out the layout, then the layout is detected', () => {
    const text = exampleCsv('bracketed', source);
    const result = parseCsvText(
      text,
      {
        channels: {
          time: { column: 'Time [ms]', unit: 'ms' },
          rpm: { column: 'Engine Speed [rpm]' },
          boost: { column: 'Boost [psig]', unit: 'psi' },
          lambda: { column: 'Air/Fuel [AFR]', unit: 'afr' },
          lambdaTarget: { column: 'Target Air/Fuel [AFR]', unit: 'afr' },
        },
      },
      { ...OPTIONS, baroKpa: 101.325 },
    );
    expect(result.mapping).toMatchObject({
      headerRow: 3,
      unitsRow: null,
      delimiter: ';',
      decimal: ',',
    });
    expect(result.suggestion).toBeNull();
    expect(result.log.channels.map?.[5]).toBeCloseTo(source[5]?.mapKpa as number, 2);
  });
});

describe('parseCsvText errors', () => {
  it.each([
    ['an empty file', 'no_header', ''],
    ['a header alone', 'no_data', 'time_s,engine_rpm,map_kpa\n'],
    ['without lambda columns', 'missing_channels', 'time_s,engine_rpm,map_kpa\n0,800,40\n'],
  ])('When the file is %s, then an ImportError with code %s is thrown', (_n, code, text) => {
    expect(() => parseCsvText(text, undefined, OPTIONS)).toThrow(expect.objectContaining({ code }));
  });

  it('When required channels are missing, then the error lists them', () => {
    expect(() => parseCsvText('Time,RPM,Boost [psig]\n0,800,3\n', undefined, OPTIONS)).toThrow(
      expect.objectContaining({ details: { missing: ['baro', 'lambda', 'lambdaTarget'] } }),
    );
  });

  it('When a mapping names a column the header lacks, then the error names that column', () => {
    const text = exampleCsv('snake', samples(3));
    const mapping = { channels: { time: { column: 'time_s' }, rpm: { column: 'rpm_x' } } };
    expect(() => parseCsvText(text, mapping, OPTIONS)).toThrow(
      expect.objectContaining({ code: 'unknown_column', details: { missing: ['rpm_x'], row: 0 } }),
    );
  });
});

describe('parseCsvChunks', () => {
  it('When a file is cut into pieces anywhere, then the import equals the whole-text import', () => {
    const texts = EXAMPLE_STYLES.map((style, k) =>
      exampleCsv(style, samples(30), { newline: k === 1 ? '\r\n' : '\n' }).replace(
        '\n',
        // a garbage row and a time going back, so problems are compared too
        k === 0
          ? '\n9,x,40,1,1,20,85,30,0,0,1,0,3,70,0,35\n-5,800,40,1,1,20,85,30,0,0,1,0,3,70,0,35\n'
          : '\n',
      ),
    );
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2 }),
        fc.array(fc.integer({ min: 1, max: 97 }), { minLength: 1 }),
        (which, cuts) => {
          const text = texts[which] as string;
          const pieces: string[] = [];
          for (let at = 0, k = 0; at < text.length; k++) {
            const size = cuts[k % cuts.length] as number;
            pieces.push(text.slice(at, at + size));
            at += size;
          }
          expect(parseCsvChunks(pieces, undefined, OPTIONS)).toEqual(
            parseCsvText(text, undefined, OPTIONS),
          );
        },
      ),
      { numRuns: 100 },
    );
  });

  it('When a quoted field holds a line break across pieces, then it stays one field', () => {
    const text =
      'time_s,rpm,map_kpa,lambda,lambda_target,note\n0,800,40,1,1,"a\nb"\n1,800,40,1,1,c\n';
    const result = parseCsvChunks([text.slice(0, 50), text.slice(50)], undefined, OPTIONS);
    expect(result.log.length).toBe(2);
  });

  it('When chunks is not iterable, then the error names it', () => {
    expect(() => parseCsvChunks(3 as unknown as string[], undefined, OPTIONS)).toThrow(/chunks/);
  });
});

describe('createPapaChunkHandler', () => {
  it('When papaparse hands over chunks, then rows are numbered across them', () => {
    const builder = createLogBuilder(
      {
        headerRow: 1,
        channels: {
          time: { column: 't' },
          rpm: { column: 'r' },
          map: { column: 'm' },
          lambda: { column: 'l' },
          lambdaTarget: { column: 'g' },
        },
      },
      OPTIONS,
    );
    const handle = createPapaChunkHandler(builder);
    handle({ data: [['preamble'], ['t', 'r', 'm', 'l', 'g'], ['0', '800', '40', '1', '1']] });
    handle({
      data: [
        ['1', 'bad', '40', '1', '1'],
        ['2', '800', '40', '1', '1'],
      ],
    });
    const { problems, log } = builder.finish();
    expect(log.length).toBe(2);
    expect(problems.map((p) => p.row)).toEqual([3]);
  });
});

describe('createCsvImporter', () => {
  it('When the file arrives in tiny pieces, then the log equals the whole-text import', () => {
    const text = [
      'time_s,engine_rpm,map_kpa,lambda_measured,lambda_target',
      ...Array.from({ length: 50 }, (_, i) => `${i / 10},${2000 + i},${60 + i / 2},0.98,1`),
    ].join('\n');
    const importer = createCsvImporter(undefined, { stoichAfr: 14.7 });
    expect(importer.plan).toBeNull();
    for (let at = 0; at < text.length; at += 7) importer.push(text.slice(at, at + 7));
    const pieces = importer.finish();
    const whole = parseCsvText(text, undefined, { stoichAfr: 14.7 });
    expect(pieces.log.length).toBe(50);
    expect(Array.from(pieces.log.channels.rpm ?? [])).toEqual(
      Array.from(whole.log.channels.rpm ?? []),
    );
    expect(() => importer.push('more')).toThrow(/after finish/);
  });
});
