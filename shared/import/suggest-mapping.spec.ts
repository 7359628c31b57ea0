import type { Channel } from '../core/channels';
import type { ChannelUnit } from './column-mapping';
import { exampleCsv, type ExampleSample } from './example-csv';
import { sniffCsv } from './sniff-csv';
import { headerSignature, suggestMapping } from './suggest-mapping';

const SAMPLE: ExampleSample = {
  timeS: 0,
  rpm: 2500,
  mapKpa: 80,
  lambda: 0.98,
  lambdaTarget: 1,
  iatC: 30,
  ectC: 88,
  tps: 20,
  stft: 1.5,
  ltft: -2,
  closedLoop: 1,
  fuelCut: 0,
  gear: 3,
  speedKph: 60,
  knockDeg: 0,
  injDuty: 25,
};
const SAMPLES = [0, 1, 2].map((i) => ({ ...SAMPLE, timeS: i * 0.05 }));

type Expected = Partial<Record<Channel, [string, ChannelUnit?]>>;

// The three styles of the simulator (the contract); each must map fully with no help.
const STYLES: [string, string, Expected][] = [
  [
    'snake',
    exampleCsv('snake', SAMPLES),
    {
      time: ['time_s', 's'],
      rpm: ['engine_rpm'],
      map: ['map_kpa', 'kPa'],
      lambda: ['lambda_measured', 'lambda'],
      lambdaTarget: ['lambda_target', 'lambda'],
      iat: ['iat_c', 'C'],
      ect: ['ect_c', 'C'],
      tps: ['throttle_pct'],
      stft: ['stft_pct'],
      ltft: ['ltft_pct'],
      closedLoop: ['closed_loop'],
      fuelCut: ['fuel_cut'],
      gear: ['gear'],
      speed: ['vehicle_speed_kph', 'kph'],
      knock: ['knock_deg'],
      injDuty: ['inj_duty_pct'],
    },
  ],
  [
    'bracketed',
    exampleCsv('bracketed', SAMPLES),
    {
      time: ['Time [ms]', 'ms'],
      rpm: ['Engine Speed [rpm]'],
      boost: ['Boost [psig]', 'psi'],
      baro: ['Barometer [inHg]', 'inHg'],
      lambda: ['Air/Fuel [AFR]', 'afr'],
      lambdaTarget: ['Target Air/Fuel [AFR]', 'afr'],
      iat: ['Intake Air Temp [F]', 'F'],
      ect: ['Coolant Temp [F]', 'F'],
      tps: ['Throttle [%]'],
      stft: ['Short Trim [%]'],
      ltft: ['Long Trim [%]'],
      closedLoop: ['Loop [CL=1]'],
      fuelCut: ['Fuel Cut [1=on]'],
      gear: ['Gear'],
      speed: ['Speed [mph]', 'mph'],
    },
  ],
  [
    'unitsrow',
    exampleCsv('unitsrow', SAMPLES),
    {
      time: ['Time', 's'],
      rpm: ['RPM'],
      map: ['MAP', 'bar'],
      lambda: ['Lambda 1', 'lambda'],
      lambdaTarget: ['Cmd Phi', 'phi'],
      iat: ['IAT', 'K'],
      ect: ['ECT', 'C'],
      tps: ['TPS'],
      stft: ['STFT'],
      ltft: ['LTFT'],
      closedLoop: ['CL'],
      fuelCut: ['DFCO'],
    },
  ],
];

describe('suggestMapping on the simulator styles', () => {
  it.each(STYLES)(
    'When the file is in the %s style, then every column is mapped',
    (_s, text, expected) => {
      const suggestion = suggestMapping(sniffCsv(text));
      const got = Object.fromEntries(
        Object.entries(suggestion.mapping.channels).map(([c, m]) => [
          c,
          m.unit === undefined ? [m.column] : [m.column, m.unit],
        ]),
      );
      expect(got).toEqual(expected);
      expect(suggestion.missing).toEqual([]);
      expect(suggestion.unmatchedColumns).toEqual([]);
    },
  );

  it('When units come from brackets or a units row, then confidence is at its highest', () => {
    const suggestion = suggestMapping(sniffCsv(exampleCsv('bracketed', SAMPLES)));
    expect(suggestion.channels.iat).toMatchObject({ unitSource: 'header', confidence: 1 });
    expect(suggestion.mapping).toMatchObject({
      headerRow: 3,
      unitsRow: null,
      delimiter: ';',
      decimal: ',',
    });
  });
});

/** One header line plus two rows of numbers (so the sniffer sees data). */
function fileWith(header: string[], values = header.map(() => '1')): string {
  return [header.join(','), values.join(','), values.join(',')].join('\n') + '\n';
}

describe('suggestMapping on single columns', () => {
  // [column name, value in it, channel, unit, unit source]
  it.each([
    ['Boost (psig)', '5', 'boost', 'psi', 'header'],
    ['Boost [psia]', '20', 'map', 'psi', 'header'],
    ['MAP [psig]', '5', 'boost', 'psi', 'header'],
    ['Intake Air Temp [F]', '80', 'iat', 'F', 'header'],
    ['manifold_pressure_psi', '10', 'map', 'psi', 'suffix'],
    ['engineRpm', '900', 'rpm', 'rpm', 'suffix'],
    ['Revs', '900', 'rpm', 'rpm', 'default'],
    ['Commanded AFR', '14.7', 'lambdaTarget', 'afr', 'suffix'],
    ['AFR Target', '14.7', 'lambdaTarget', 'afr', 'name'],
    ['Lambda Desired', '1', 'lambdaTarget', 'lambda', 'name'],
    ['Equivalence Ratio', '1', 'lambda', 'phi', 'name'],
    ['Wideband', '14.5', 'lambda', 'afr', 'values'],
    ['Wideband', '0.98', 'lambda', 'lambda', 'default'],
    ['Baro', '29.9', 'baro', 'inHg', 'values'],
    ['Coolant', '360', 'ect', 'K', 'values'],
    ['Knock Retard [deg]', '2', 'knock', 'deg', 'header'],
    ['Injector Duty Cycle', '40', 'injDuty', '%', 'default'],
    ['VSS (km/h)', '50', 'speed', 'kph', 'header'],
    ['Current Gear', '3', 'gear', undefined, 'none'],
    ['Closed Loop Status', '1', 'closedLoop', undefined, 'none'],
    ['DFCO Active', '0', 'fuelCut', undefined, 'none'],
  ])(
    'When a column is named %s holding %s, then it maps to %s in %s (from %s)',
    (name, value, channel, unit, source) => {
      const sniff = sniffCsv(fileWith(['Note', name], ['x', value]));
      const suggestion = suggestMapping(sniff);
      const got = suggestion.channels[channel as Channel];
      expect(got?.column).toBe(name);
      expect(got?.unit).toBe(unit);
      expect(got?.unitSource).toBe(source);
    },
  );

  it.each([
    ['MAP [V]', 'map'],
    ['Boost Target', 'boost'],
    ['O2 Sensor Volts', 'lambda'],
    ['Injector Pulse Time', 'time'],
    ['Engine Speed [rpm]', 'speed'],
  ])('When a column is named %s, then it does not map to %s', (name, channel) => {
    const suggestion = suggestMapping(sniffCsv(fileWith(['Note', name], ['x', '1'])));
    expect(suggestion.channels[channel as Channel]).toBeUndefined();
  });

  it('When required channels cannot be found, then they are listed as missing', () => {
    const suggestion = suggestMapping(sniffCsv(fileWith(['Time', 'RPM', 'Boost [psi]'])));
    expect(suggestion.missing).toEqual(['baro', 'lambda', 'lambdaTarget']);
    const withBaro = suggestMapping(sniffCsv(fileWith(['Time', 'RPM', 'Boost [psi]'])), {
      defaultBaroKpa: 101.325,
    });
    expect(withBaro.missing).toEqual(['lambda', 'lambdaTarget']);
    expect(suggestMapping(sniffCsv(fileWith(['a', 'b']))).missing).toEqual([
      'time',
      'rpm',
      'map',
      'lambda',
      'lambdaTarget',
    ]);
  });

  it('When two columns fit one channel, then the more confident one wins and the other stays free', () => {
    const suggestion = suggestMapping(sniffCsv(fileWith(['Throttle Body Angle', 'TPS'])));
    expect(suggestion.channels.tps?.column).toBe('TPS');
  });

  it('When options.defaultBaroKpa is not a positive number, then the error names it', () => {
    const sniff = sniffCsv(fileWith(['Time', 'RPM']));
    expect(() => suggestMapping(sniff, { defaultBaroKpa: -1 })).toThrow(/defaultBaroKpa/);
  });
});

describe('headerSignature', () => {
  it('When columns differ only in order, case or spacing, then the signature is the same', () => {
    const a = headerSignature([{ name: 'Time [ms]' }, { name: 'Engine  Speed [rpm]' }]);
    const b = headerSignature([{ name: 'engine speed [RPM]' }, { name: ' TIME [ms]' }]);
    expect(a).toBe(b);
    expect(a).toBe('engine speed [rpm]|time [ms]');
  });

  it('When a column is added or renamed, then the signature changes', () => {
    const base = headerSignature([{ name: 'Time' }, { name: 'RPM' }]);
    expect(headerSignature([{ name: 'Time' }, { name: 'RPM' }, { name: 'MAP' }])).not.toBe(base);
    expect(headerSignature([{ name: 'Time' }, { name: 'Engine RPM' }])).not.toBe(base);
  });
});
