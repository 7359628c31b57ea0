import type { ColumnMappingInput, MappingPreset } from '../../shared/contracts/logs';
import { headerSignature, sniffCsv } from '../../shared/import';
import { ApiClient, signedIn } from './support/api-client';
import { insertTestVehicle, postLog, simulatedCsv } from './support/test-logs';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

/** The preset route of a header, its signature URL-encoded as a client must. */
function presetPath(text: string): string {
  return `/api/mapping-presets/${encodeURIComponent(headerSignature(sniffCsv(text).columns))}`;
}

/** The bracketed style's columns (semicolons, decimal commas), mapped by hand. */
const BRACKETED_MAPPING: ColumnMappingInput = {
  channels: {
    time: { column: 'Time [ms]', unit: 'ms' },
    rpm: { column: 'Engine Speed [rpm]' },
    boost: { column: 'Boost [psig]', unit: 'psi' },
    baro: { column: 'Barometer [inHg]', unit: 'inHg' },
    lambda: { column: 'Air/Fuel [AFR]', unit: 'afr' },
    lambdaTarget: { column: 'Target Air/Fuel [AFR]', unit: 'afr' },
  },
};

describe('GET /api/mapping-presets/:signature', () => {
  let t: TestApp;
  let shop: TestShop;
  let other: TestShop;
  let tuner: ApiClient;
  let vehicleId: string;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'presets');
    other = await createTestShop(t.db, 'presets-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    vehicleId = await insertTestVehicle(t.db, shop.id);
  });
  afterAll(() => t.close());

  it('When the shop has no preset for a header, then 404', async () => {
    const res = await tuner.get(presetPath(simulatedCsv('unitsrow', 70)));
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('When an upload gave a mapping, then its header’s preset is that mapping (a "/" in a name survives encoding)', async () => {
    const text = simulatedCsv('bracketed', 71);
    const signature = headerSignature(sniffCsv(text).columns);
    expect(signature).toContain('air/fuel [afr]');
    const before = Date.now();
    expect((await postLog(tuner, vehicleId, text, { mapping: BRACKETED_MAPPING })).status).toBe(
      202,
    );

    const res = await tuner.get(presetPath(text));
    expect(res.status).toBe(200);
    const preset = res.body as MappingPreset;
    expect(preset).toMatchObject({ signature, mapping: BRACKETED_MAPPING });
    expect(preset.name).toContain('session.csv');
    expect(Date.parse(preset.updatedAt)).toBeGreaterThanOrEqual(before - 1000);
  });

  it('When a later upload of the same header gives another mapping, then it replaces the preset', async () => {
    const first = await tuner.get(presetPath(simulatedCsv('bracketed', 72)));
    const changed: ColumnMappingInput = {
      channels: { ...BRACKETED_MAPPING.channels, tps: { column: 'Throttle [%]' } },
    };
    const res = await postLog(tuner, vehicleId, simulatedCsv('bracketed', 73), {
      mapping: changed,
    });
    expect(res.status).toBe(202);
    const now = (await tuner.get(presetPath(simulatedCsv('bracketed', 72)))).body as MappingPreset;
    expect(now.mapping).toEqual(changed);
    expect(Date.parse(now.updatedAt)).toBeGreaterThanOrEqual(Date.parse(first.body.updatedAt));
  });

  it('When the header is the same but columns come in another order or case, then the same preset', async () => {
    const text = simulatedCsv('bracketed', 74);
    const lines = text.split('\n');
    const header = (lines[3] as string).split(';');
    lines[3] = [...header].reverse().join(';').toUpperCase();
    expect(lines[3]).not.toBe(header.join(';'));
    expect((await tuner.get(presetPath(lines.join('\n')))).status).toBe(200);
  });

  it('When a reviewer asks, then 200; another shop’s tuner gets 404; nobody signed in, 401', async () => {
    const path = presetPath(simulatedCsv('bracketed', 75));
    const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
    expect((await reviewer.get(path)).status).toBe(200);
    const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
    expect((await stranger.get(path)).status).toBe(404);
    expect((await new ApiClient(t.app).get(path)).status).toBe(401);
  });

  it('When the shop lists its presets, then each comes with its signature; another shop sees none of them', async () => {
    const res = await tuner.get('/api/mapping-presets');
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(res.body.items.length);
    const signatures = (res.body.items as MappingPreset[]).map((p) => p.signature);
    expect(signatures).toContain(headerSignature(sniffCsv(simulatedCsv('bracketed', 76)).columns));
    const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
    expect((await stranger.get('/api/mapping-presets')).body).toEqual({ items: [], total: 0 });
  });

  it('When the list is asked for one signature, then it holds that preset alone, or nothing', async () => {
    const signature = headerSignature(sniffCsv(simulatedCsv('bracketed', 77)).columns);
    const found = await tuner.get('/api/mapping-presets').query({ signature });
    expect(found.status).toBe(200);
    expect(found.body.total).toBe(1);
    expect(found.body.items[0].signature).toBe(signature);
    const none = await tuner.get('/api/mapping-presets').query({ signature: 'no|such|header' });
    expect(none.body).toEqual({ items: [], total: 0 });
    const bad = await tuner.get('/api/mapping-presets').query({ signature: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toBe('query.signature');
  });
});
