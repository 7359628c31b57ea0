import { type Unit, unit } from 'mathjs';
import Papa from 'papaparse';
import { DEMO_WAGON } from './demo-vehicles';
import { csvChunks, csvLines, csvText } from './csv-export';
import { type SimSample } from './sim-sample';
import { simulateSamples } from './simulate-log';

// Road and dyno samples together cover vacuum, boost, fuel cut, trims and every gear.
const samples: SimSample[] = [
  ...simulateSamples({ vehicle: DEMO_WAGON, kind: 'road', seed: 4, durationS: 300 }),
  ...simulateSamples({ vehicle: DEMO_WAGON, kind: 'dyno', seed: 4, durationS: 150 }),
];
const stoichAfr = DEMO_WAGON.engine.stoichAfr;

/** The largest of `error(row, sample)` over all rows: one assertion per check keeps this fast. */
function worst(rows: number[][], error: (row: number[], s: SimSample) => number): number {
  return rows.reduce((max, row, i) => Math.max(max, error(row, samples[i]!)), 0);
}

function lines(text: string): string[] {
  return text.split('\n');
}

function parse(text: string, delimiter: string): string[][] {
  const result = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: true });
  expect(result.errors).toEqual([]);
  return result.data;
}

const conversions = new Map<string, { scale: number; offset: number }>();

/** A linear unit conversion taken from mathjs once per unit pair (per-value parsing is slow). */
function convert(value: number, from: string, to: string): number {
  const key = `${from}>${to}`;
  let c = conversions.get(key);
  if (!c) {
    const offset = (unit(0, from) as Unit).toNumber(to);
    c = { offset, scale: (unit(1, from) as Unit).toNumber(to) - offset };
    conversions.set(key, c);
  }
  return c.offset + c.scale * value;
}

describe('csvLines: the snake style', () => {
  const text = csvText(samples, 'snake');

  it('When written, then the header is exactly the contract and there is no preamble', () => {
    expect(lines(text)[0]).toBe(
      'time_s,engine_rpm,map_kpa,lambda_measured,lambda_target,iat_c,ect_c,throttle_pct,stft_pct,' +
        'ltft_pct,closed_loop,fuel_cut,gear,vehicle_speed_kph,knock_deg,inj_duty_pct',
    );
    expect(lines(text)).toHaveLength(samples.length + 2); // header, rows, final newline
  });

  it('When parsed back with papaparse, then every value matches within its rounding', () => {
    const rows = parse(text, ',')
      .slice(1)
      .map((row) => row.map(Number));
    expect(rows).toHaveLength(samples.length);
    const fields = [
      ['timeS', 5e-4],
      ['rpm', 0.5],
      ['mapKpa', 0.005],
      ['lambdaMeasured', 5e-5],
      ['lambdaTarget', 5e-4],
      ['iatC', 0.05],
      ['ectC', 0.05],
      ['tpsPct', 0.05],
      ['stftPct', 0.005],
      ['ltftPct', 0.005],
      ['closedLoop', 0],
      ['fuelCut', 0],
      ['gear', 0],
      ['speedKph', 0.05],
      ['knockDeg', 0.05],
      ['injDutyPct', 0.05],
    ] as const;
    fields.forEach(([field, rounding], k) => {
      const error = worst(rows, (row, s) => Math.abs(row[k]! - s[field]));
      expect({ field, error: error <= rounding + 1e-9 }).toEqual({ field, error: true });
    });
  });
});

describe('csvLines: the bracketed style', () => {
  const text = csvText(samples, 'bracketed', {
    vehicleLabel: DEMO_WAGON.label,
    startedAt: '2024-06-01T07:45:00Z',
    stoichAfr,
  });

  it('When written, then three preamble lines come before the exact header', () => {
    expect(lines(text).slice(0, 4)).toEqual([
      'Cellsmith simulator export',
      'Vehicle: Demo wagon 2.5T E85',
      'Started: 2024-06-01T07:45:00Z',
      'Time [ms];Engine Speed [rpm];Boost [psig];Barometer [inHg];Air/Fuel [AFR];' +
        'Target Air/Fuel [AFR];Intake Air Temp [F];Coolant Temp [F];Throttle [%];Short Trim [%];' +
        'Long Trim [%];Loop [CL=1];Fuel Cut [1=on];Gear;Speed [mph]',
    ]);
  });

  it('When parsed back (decimal comma, psi gauge, inHg, °F, mph, AFR), then values match', () => {
    // Conversions back: mathjs 15.2.0 units for psi, °F and mph [C]; inHg 3.386389 kPa (from
    // memory of the conventional inch of mercury) [S*]; AFR = λ · AFR_st (reference.md §3) [C]
    const rows = parse(lines(text).slice(4).join('\n'), ';').map((row) =>
      row.map((cell) => Number(cell.replace(',', '.'))),
    );
    expect(rows).toHaveLength(samples.length);
    const baro = (row: number[]) => row[3]! * 3.386389;
    const afr = 0.005 / stoichAfr + 1e-9;
    expect(worst(rows, (r, s) => Math.abs(r[0]! / 1000 - s.timeS))).toBeLessThanOrEqual(5e-4);
    expect(worst(rows, (r, s) => Math.abs(r[1]! - s.rpm))).toBeLessThanOrEqual(0.5);
    expect(
      worst(rows, (r, s) => Math.abs(convert(r[2]!, 'psi', 'kPa') + baro(r) - s.mapKpa)),
    ).toBeLessThan(0.01);
    expect(worst(rows, (r, s) => Math.abs(baro(r) - s.baroKpa))).toBeLessThan(0.002);
    expect(worst(rows, (r, s) => Math.abs(r[4]! / stoichAfr - s.lambdaMeasured))).toBeLessThan(afr);
    expect(worst(rows, (r, s) => Math.abs(r[5]! / stoichAfr - s.lambdaTarget))).toBeLessThan(afr);
    expect(worst(rows, (r, s) => Math.abs(convert(r[6]!, 'degF', 'degC') - s.iatC))).toBeLessThan(
      0.03,
    );
    expect(worst(rows, (r, s) => Math.abs(convert(r[7]!, 'degF', 'degC') - s.ectC))).toBeLessThan(
      0.03,
    );
    expect(worst(rows, (r, s) => Math.abs(r[9]! - s.stftPct))).toBeLessThanOrEqual(0.005 + 1e-9);
    expect(
      worst(
        rows,
        (r, s) =>
          Math.abs(r[11]! - s.closedLoop) +
          Math.abs(r[12]! - s.fuelCut) +
          Math.abs(r[13]! - s.gear),
      ),
    ).toBe(0);
    expect(
      worst(rows, (r, s) => Math.abs(convert(r[14]!, 'mi/h', 'km/h') - s.speedKph)),
    ).toBeLessThan(0.09);
  });
});

describe('csvLines: the unitsrow style', () => {
  const text = csvText(samples, 'unitsrow');

  it('When written, then the exact header is followed by the units row', () => {
    expect(lines(text).slice(0, 2)).toEqual([
      'Time\tRPM\tMAP\tLambda 1\tCmd Phi\tIAT\tECT\tTPS\tSTFT\tLTFT\tCL\tDFCO',
      's\trpm\tbar\tλ\tphi\tK\t°C\t%\t%\t%\t\t',
    ]);
  });

  it('When parsed back (bar absolute, kelvin, φ = 1/λ), then values match', () => {
    // Conversions back: mathjs 15.2.0 units for bar and K [C]; φ = 1/λ (reference.md §5) [C]
    const rows = parse(text, '\t')
      .slice(2)
      .map((row) => row.map(Number));
    expect(rows).toHaveLength(samples.length);
    expect(
      worst(rows, (r, s) => Math.abs(convert(r[2]!, 'bar', 'kPa') - s.mapKpa)),
    ).toBeLessThanOrEqual(0.005 + 1e-9);
    expect(worst(rows, (r, s) => Math.abs(r[3]! - s.lambdaMeasured))).toBeLessThanOrEqual(
      5e-5 + 1e-12,
    );
    expect(worst(rows, (r, s) => Math.abs(1 / r[4]! - s.lambdaTarget))).toBeLessThan(1e-4);
    expect(
      worst(rows, (r, s) => Math.abs(convert(r[5]!, 'K', 'degC') - s.iatC)),
    ).toBeLessThanOrEqual(0.05 + 1e-9);
    expect(
      worst(rows, (r, s) => Math.abs(r[10]! - s.closedLoop) + Math.abs(r[11]! - s.fuelCut)),
    ).toBe(0);
  });
});

describe('streaming', () => {
  it('When the samples never end, then the first lines still come at once', () => {
    function* endless(): Generator<SimSample> {
      for (let i = 0; ; i++) yield { ...(samples[i % samples.length] as SimSample), timeS: i / 20 };
    }
    const iterator = csvLines(endless(), 'snake');
    const first = [iterator.next().value, iterator.next().value, iterator.next().value];
    expect(first[2]).toMatch(/^0\.050,/);
  });

  it('When chunked, then the chunks join to the same text as the lines', () => {
    const few = samples.slice(0, 1000);
    const chunks = [...csvChunks(few, 'unitsrow', { rowsPerChunk: 64 })];
    expect(chunks.length).toBe(Math.ceil(1002 / 64));
    expect(chunks.join('')).toBe([...csvLines(few, 'unitsrow')].join(''));
  });

  it.each([
    ['vehicleLabel', { vehicleLabel: 'two\nlines' }],
    ['startedAt', { startedAt: 'yesterday' }],
    ['stoichAfr', { stoichAfr: 0 }],
  ])('When options.%s is invalid, then it throws naming it', (name, options) => {
    expect(() => csvText(samples.slice(0, 2), 'bracketed', options)).toThrow(name);
  });
});
