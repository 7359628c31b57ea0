import type { Page } from 'playwright-core';
import { csvText, DEMO_HATCH, ecuVeTable, simulateSamples } from '../../../shared/sim';

/** Calls the API with the page's session, echoing the XSRF cookie as the app does. */
export async function api<T>(
  page: Page,
  baseUrl: string,
  method: 'post',
  path: string,
  data: object,
) {
  const cookies = await page.context().cookies(baseUrl);
  const xsrf = decodeURIComponent(cookies.find((c) => c.name === 'XSRF-TOKEN')?.value ?? '');
  const res = await page.request[method](`${baseUrl}${path}`, {
    data,
    headers: { 'X-XSRF-TOKEN': xsrf },
  });
  if (!res.ok()) throw new Error(`${method} ${path} answered ${res.status()}: ${await res.text()}`);
  return (await res.json()) as T;
}

/**
 * A new vehicle like the demo hatch whose table runs rich everywhere (4 % above its own error
 * field) and one road drive logged on it: the drive reaches low load only, so filling the
 * correction wants to lean the boost cells no log reached — the case the guard holds.
 */
export async function richTableWithRoadLog(
  page: Page,
  baseUrl: string,
  tag: string,
): Promise<{ vehicleId: string; tableId: string; tableName: string; label: string }> {
  const label = `Guard hatch ${tag}`;
  const vehicle = await api<{ id: string }>(page, baseUrl, 'post', '/api/vehicles', {
    label,
    description: 'Invented test car for the fuel-safety guard',
    engine: {
      displacementL: DEMO_HATCH.engine.displacementL,
      cylinders: DEMO_HATCH.engine.cylinders,
      fuel: 'gasoline',
      injectorCcMin: DEMO_HATCH.engine.injectorCcMin,
    },
    gearing: {
      tireDiameterMm: DEMO_HATCH.gearing.tireDiameterMm,
      gearRatios: [...DEMO_HATCH.gearing.gearRatios],
      finalDrive: DEMO_HATCH.gearing.finalDrive,
    },
  });
  const rich = { ...DEMO_HATCH, ecuError: { ...DEMO_HATCH.ecuError, offset: 0.04 } };
  const start = ecuVeTable(rich);
  const tableName = 'Guarded VE';
  const table = await api<{ id: string; headRevisionId: string }>(
    page,
    baseUrl,
    'post',
    `/api/vehicles/${vehicle.id}/tables`,
    {
      name: tableName,
      rpmAxis: [...start.rpmAxis],
      mapAxisKpa: [...start.mapAxisKpa],
      values: start.values.map((row) => row.map((v) => Math.round(v * 100) / 100)),
    },
  );
  const text = csvText(
    simulateSamples({
      vehicle: rich,
      kind: 'road',
      seed: 32,
      durationS: 600,
      startEctC: 80,
      speedCapKph: 70,
      ecuTable: start,
    }),
    'snake',
    { stoichAfr: DEMO_HATCH.engine.stoichAfr, vehicleLabel: label },
  );
  const cookies = await page.context().cookies(baseUrl);
  const xsrf = decodeURIComponent(cookies.find((c) => c.name === 'XSRF-TOKEN')?.value ?? '');
  const upload = await page.request.post(`${baseUrl}/api/vehicles/${vehicle.id}/logs`, {
    headers: { 'X-XSRF-TOKEN': xsrf },
    multipart: {
      file: { name: `guard-${tag}.csv`, mimeType: 'text/csv', buffer: Buffer.from(text) },
      kind: 'road',
      ecuRevisionId: table.headRevisionId,
    },
  });
  if (upload.status() !== 202) throw new Error(`upload answered ${upload.status()}`);
  const { id } = (await upload.json()) as { id: string };
  const deadline = Date.now() + 60_000;
  for (;;) {
    const log = (await (await page.request.get(`${baseUrl}/api/logs/${id}`)).json()) as {
      status: string;
    };
    if (log.status === 'ready') break;
    if (log.status === 'failed' || Date.now() > deadline) {
      throw new Error(`the guard test log ended ${log.status}`);
    }
    await page.waitForTimeout(250);
  }
  return { vehicleId: vehicle.id, tableId: table.id, tableName, label };
}
