import type { MappingPreset } from '@shared/contracts/logs';
import { SNIFF_LENGTH } from '@shared/import/sniff-csv';
import { firstValueFrom, of } from 'rxjs';
import { checkMapping, readFileHead, readHead } from './mapping-check';

const SURE = [
  'time_s,engine_rpm,map_kpa,lambda_measured,lambda_target',
  '0.00,900,35.2,1.010,1.000',
  '0.05,905,35.0,1.005,1.000',
].join('\n');

const ODD = [
  'clock_s,engine_rpm,manifold_x,probe_a,probe_a_aim',
  '0.00,900,35.2,1.010,1.000',
  '0.05,905,35.0,1.005,1.000',
].join('\n');

const PRESET: MappingPreset = {
  signature: 'x',
  name: 'Columns of x.csv',
  mapping: { channels: {} },
  updatedAt: '2026-03-01T10:00:00.000Z',
};

/** A file of `text`. */
const fileOf = (text: string) => new File([text], 'log.csv', { type: 'text/csv' });

describe('mapping check', () => {
  it('When a file is longer than the head, then only the head is read and it says so', async () => {
    const long = 'a'.repeat(SNIFF_LENGTH + 10);
    const head = await readFileHead(fileOf(long));
    expect(head).toEqual({ text: 'a'.repeat(SNIFF_LENGTH), isTruncated: true });
    expect(await readFileHead(fileOf(SURE))).toEqual({ text: SURE, isTruncated: false });
  });

  it('When the head has no header, then there is no reading (the server will say why)', () => {
    expect(readHead({ text: '1,2\n3,4\n', isTruncated: false })).toBeNull();
    expect(readHead({ text: SURE, isTruncated: false })?.signature).toBe(
      'engine_rpm|lambda_measured|lambda_target|map_kpa|time_s',
    );
  });

  it.each<[string, string, MappingPreset | null, string]>([
    ['sure names, no preset', SURE, null, 'ready:trusted'],
    ['odd names with a preset', ODD, PRESET, 'ready:preset'],
    ['odd names, no preset', ODD, null, 'review'],
    ['no header at all', '1,2\n3,4\n', null, 'ready:unreadable'],
  ])('When the file has %s, then the check is %s', async (_name, text, preset, expected) => {
    const asked: string[] = [];
    const check = await firstValueFrom(
      checkMapping(fileOf(text), (signature) => {
        asked.push(signature);
        return of(preset);
      }),
    );
    expect(check.kind === 'ready' ? `ready:${check.reason}` : check.kind).toBe(expected);
    expect(asked.length).toBe(expected === 'ready:unreadable' ? 0 : 1);
  });
});
