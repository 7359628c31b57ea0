import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import {
  HttpTestingController,
  provideHttpClientTesting,
  type TestRequest,
} from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { provideRouter } from '@angular/router';
import type { MappingPreset } from '@shared/contracts/logs';
import type { RevisionSummary, VeTableResource } from '@shared/contracts/tables';
import type { Vehicle } from '@shared/contracts/vehicles';
import { noAnimations } from '../../../testing/harness-helpers';
import { LogUpload } from './log-upload';

const VEHICLE = {
  id: 'v1',
  label: 'Demo hatch',
  description: '',
  engine: {
    displacementL: 1.6,
    cylinders: 4,
    fuel: 'gasoline',
    stoichAfr: 14.7,
    injectorCcMin: 550,
  },
  gearing: { tireDiameterMm: 620, gearRatios: [3.5, 2, 1.4, 1, 0.8], finalDrive: 4 },
  fuelSafety: { loadLinePercentOfBaro: 90, leanAllowancePercent: 1 },
  createdAt: '2026-03-01T10:00:00.000Z',
  updatedAt: '2026-03-01T10:00:00.000Z',
} as Vehicle;

const TABLE: VeTableResource = {
  id: 't1',
  vehicleId: 'v1',
  name: 'Main VE',
  rpmAxis: [1000, 2000],
  mapAxisKpa: [40, 100],
  headRevisionId: 'r2',
  createdAt: '2026-03-01T10:00:00.000Z',
};

const REVISION: RevisionSummary = {
  id: 'r2',
  tableId: 't1',
  parentId: 'r1',
  number: 2,
  status: 'approved',
  message: 'Leaner cruise',
  authorId: 'u1',
  authorName: 'Tom',
  analysisId: null,
  createdAt: '2026-03-02T10:00:00.000Z',
};

const SURE = 'time_s,engine_rpm,map_kpa,lambda_measured,lambda_target\n0.00,900,35.2,1.01,1.00\n';
const ODD = 'clock_s,engine_rpm,manifold_x,probe_a,probe_a_aim\n0.00,900,35.2,1.01,1.00\n';

describe('LogUpload', () => {
  let fixture: ComponentFixture<LogUpload>;
  let loader: HarnessLoader;
  let root: HarnessLoader;
  let http: HttpTestingController;

  /**
   * Waits until a request matches, and returns it. Harness actions wait for the app to be
   * stable, which a pending request prevents, so an action that sends one is started, its
   * requests answered here, and only then awaited.
   */
  async function nextRequest(url: string, method = 'GET'): Promise<TestRequest> {
    for (let attempt = 0; attempt < 200; attempt++) {
      const found = http.match((r) => r.url === url && r.method === method);
      if (found.length > 0) return found[0] as TestRequest;
      await new Promise((resolve) => setTimeout(resolve, 5));
    }
    throw new Error(`no ${method} ${url}`);
  }

  /**
   * Picks the vehicle and the revision, chooses a file of `text` and presses Upload; returns the
   * press, which runs on until the requests it sends are answered.
   */
  async function upload(text: string): Promise<{ press: Promise<void> }> {
    const vehicle = await loader.getHarness(MatSelectHarness.with({ selector: '.vehicle-select' }));
    const picked = vehicle.clickOptions({ text: 'Demo hatch' });
    (await nextRequest('/api/vehicles/v1/tables')).flush({ items: [TABLE], total: 1 });
    (await nextRequest('/api/tables/t1/revisions')).flush({ items: [REVISION], total: 1 });
    await picked;
    const revision = await loader.getHarness(
      MatSelectHarness.with({ selector: '.revision-select' }),
    );
    await revision.clickOptions({ text: 'r2 · approved · Leaner cruise' });
    const input = fixture.nativeElement.querySelector('input[type=file]') as HTMLInputElement;
    const file = new File([text], 'log.csv', { type: 'text/csv' });
    Object.defineProperty(input, 'files', { value: { item: () => file, length: 1 } });
    input.dispatchEvent(new Event('change'));
    const button = await loader.getHarness(MatButtonHarness.with({ text: /Upload/ }));
    return { press: button.click() };
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), noAnimations],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(LogUpload);
    fixture.componentRef.setInput('vehicles', [VEHICLE]);
    loader = TestbedHarnessEnvironment.loader(fixture);
    root = TestbedHarnessEnvironment.documentRootLoader(fixture);
  });

  it.each<[string, string, MappingPreset | null]>([
    ['sure column names', SURE, null],
    [
      'odd names the shop has a preset for',
      ODD,
      { signature: 's', name: 'n', mapping: { channels: {} }, updatedAt: '2026-03-01T10:00:00Z' },
    ],
  ])(
    'When the file has %s, then it is sent at once, without a mapping',
    async (_n, text, preset) => {
      const { press } = await upload(text);
      const lookup = await nextRequest('/api/mapping-presets');
      lookup.flush({ items: preset ? [preset] : [], total: preset ? 1 : 0 });
      const post = await nextRequest('/api/vehicles/v1/logs', 'POST');
      post.flush({ id: 'l1', status: 'queued' }, { status: 202, statusText: 'Accepted' });
      (await nextRequest('/api/logs/l1')).flush({ id: 'l1', status: 'ready', fileName: 'log.csv' });
      await press;
      const body = post.request.body as FormData;
      expect(body.get('mapping')).toBeNull();
      expect(body.get('ecuRevisionId')).toBe('r2');
      expect(body.get('kind')).toBe('road');
      expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    },
  );

  it('When the names are unsure and there is no preset, then the mapping dialog asks first', async () => {
    const { press } = await upload(ODD);
    (await nextRequest('/api/mapping-presets')).flush({ items: [], total: 0 });
    await press;
    const dialog = await root.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Map the columns of log.csv');
    expect(http.match((r) => r.method === 'POST')).toHaveLength(0);

    await (await root.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain(
      'Not uploaded: the column mapping was cancelled.',
    );
    expect(http.match((r) => r.method === 'POST')).toHaveLength(0);
  });
});
