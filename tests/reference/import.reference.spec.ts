import { unit } from 'mathjs';
import { parseCsvText } from '../../shared/import';
import { STOICH_AFR } from '../../shared/units';

/** Imports one data row whose columns are named and united as given; returns the log. */
function importRow(columns: Record<string, string | null>, options: { baroKpa?: number } = {}) {
  const base: Record<string, string> = {
    'Time [s]': '0',
    'RPM [rpm]': '3000',
    'Lambda [λ]': '1',
    'Target Lambda [λ]': '1',
  };
  // A column given as null is left out of the file.
  const all = Object.fromEntries(
    Object.entries({ ...base, ...columns }).filter(
      (entry): entry is [string, string] => entry[1] !== null,
    ),
  );
  if (!Object.keys(all).some((k) => /MAP|Boost/.test(k))) all['MAP [kPa]'] = '100';
  const text = `${Object.keys(all).join(';')}\n${Object.values(all).join(';')}\n`;
  return parseCsvText(text, undefined, { stoichAfr: STOICH_AFR.gasoline, ...options }).log;
}

describe('import conversions against published values', () => {
  it('10 psig with a standard barometer is 170.273 kPa absolute', () => {
    // Source: computed from the formulas (reference.md §4), baro 101.325 kPa (USSA-1976 [S]) [C]
    const log = importRow({ 'Boost [psig]': '10', 'Baro [kPa]': '101.325' });
    expect(log.channels.map?.[0]).toBeCloseTo(170.273, 3);
  });

  it('10 psig with baro given as an option is also 170.273 kPa', () => {
    // Source: computed from the formulas (reference.md §4) [C]
    const log = importRow({ 'Boost [psig]': '10' }, { baroKpa: 101.325 });
    expect(log.channels.map?.[0]).toBeCloseTo(170.273, 3);
  });

  it('77 °F is 25 °C and −40 °F is −40 °C', () => {
    // Source: the definition °F = 1.8 °C + 32 (reference.md §4) [C]
    expect(importRow({ 'IAT [°F]': '77' }).channels.iat?.[0]).toBeCloseTo(25, 12);
    expect(importRow({ 'IAT [°F]': '-40' }).channels.iat?.[0]).toBeCloseTo(-40, 12);
  });

  it('AFR 14.7 on gasoline is λ 1.0', () => {
    // common practice, no published source: the trade's gasoline stoichiometric AFR 14.7 [P]
    const log = importRow({ 'Lambda [λ]': null, 'Wideband [AFR]': '14.7' });
    expect(log.channels.lambda?.[0]).toBeCloseTo(1, 12);
  });

  it('commanded 13.9 AFR on gasoline at 14.64 is λ 0.95', () => {
    // Source: SAE J1979 text "gasoline, stoichiometric is 14.64:1", commanded 0.95 → 13.9 A/F
    // (read via quotes, reference.md §3) [S]
    const text = 'Time;RPM;MAP;Lambda;Target AFR\n0;3000;100;1;13.9\n';
    const { log } = parseCsvText(text, undefined, { stoichAfr: 14.64 });
    expect(log.channels.lambdaTarget?.[0]).toBeCloseTo(0.95, 2);
  });

  it('φ 1.25 is λ 0.8', () => {
    // from memory of Heywood, ICE Fundamentals 1st ed. §3.3: φ = 1/λ [S*]
    const log = importRow({ 'Target Lambda [λ]': null, 'Cmd Phi [phi]': '1.25' });
    expect(log.channels.lambdaTarget?.[0]).toBeCloseTo(0.8, 12);
  });

  it('°F, psi and mph agree with mathjs', () => {
    // Source: mathjs 15.2.0 unit system (a general-purpose reference library)
    const log = importRow({
      'MAP [psi]': '14.7',
      'IAT [°F]': '212',
      'Speed [mph]': '60',
    });
    // mathjs's psi differs from NIST's by 6e-11 relative (reference.md §4): compare at 1e-9.
    const psi = unit(14.7, 'psi').toNumber('kPa');
    expect(Math.abs((log.channels.map?.[0] as number) - psi) / psi).toBeLessThan(1e-9);
    expect(log.channels.iat?.[0]).toBeCloseTo(unit(212, 'degF').toNumber('degC'), 9);
    expect(log.channels.speed?.[0]).toBeCloseTo(unit(60, 'mi/h').toNumber('km/h'), 9);
  });

  it('30 inHg is 101.59 kPa', () => {
    // from memory of NIST SP 811: conventional inHg = 3386.389 Pa [S*] (mathjs lacks inHg)
    const log = importRow({ 'MAP [inHg]': '30' });
    expect(log.channels.map?.[0]).toBeCloseTo(101.59167, 5);
  });
});
