import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { UnitSystem } from '@shared/contracts/preferences';
import type { CreateVehicleInput, Vehicle } from '@shared/contracts/vehicles';
import { fillField, noAnimations } from '../../../testing/harness-helpers';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { VehicleDialog, type VehicleDialogData } from './vehicle-dialog';

const VEHICLE: Vehicle = {
  id: 'v1',
  label: 'Test hatch',
  description: '',
  engine: { displacementL: 2, cylinders: 4, fuel: 'gasoline', stoichAfr: 14.7, injectorCcMin: 550 },
  gearing: { tireDiameterMm: 631.9, gearRatios: [3.4, 1.9, 1.3], finalDrive: 4.06 },
  fuelSafety: { loadLinePercentOfBaro: 95, leanAllowancePercent: 0.5 },
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
};

describe('VehicleDialog', () => {
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let close: jest.Mock;

  /** Opens the dialog on `vehicle` (null: a new one) with the user's units set to `units`. */
  async function open(units: UnitSystem, vehicle: Vehicle | null): Promise<void> {
    close = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        noAnimations,
        { provide: DisplayPreferences, useValue: { units: () => units } },
        { provide: MatDialogRef, useValue: { close } },
        { provide: MAT_DIALOG_DATA, useValue: { vehicle } satisfies VehicleDialogData },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(VehicleDialog);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  /** The form field labelled `label`. */
  function formField(label: string): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  /** The value and first hint of the field labelled `label`. */
  async function field(label: string): Promise<{ value: string; hint: string }> {
    const harness = await formField(label);
    const input = await harness.getControl(MatInputHarness);
    return {
      value: (await input?.getValue()) ?? '',
      hint: ((await harness.getTextHints())[0] ?? '').trim(),
    };
  }

  /** The text suffix of a field (its unit). */
  async function suffixOf(label: string): Promise<string> {
    return (await (await formField(label)).getSuffixText()).trim();
  }

  /** Presses the dialog's button named `name`. */
  async function press(name: string): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: name }))).click();
  }

  afterEach(() => http.verify());

  it('When a metric user edits, then the fields are in L, cc/min and mm as stored', async () => {
    await open('metric', VEHICLE);

    expect(await field('Displacement')).toMatchObject({ value: '2', hint: '0.05–20 L' });
    expect(await suffixOf('Displacement')).toBe('L');
    expect(await field('Injector flow')).toMatchObject({ value: '550', hint: '10–10000 cc/min' });
    expect(await field('Tyre diameter')).toMatchObject({ value: '631.9', hint: '200–1500 mm' });
  });

  it('When an imperial user edits, then the fields show ci, lb/h and in with their ranges', async () => {
    await open('imperial', VEHICLE);

    // 2 L = 122.05 ci; 550 cc/min of gasoline = 54.2 lb/h; 631.9 mm = 24.88 in
    expect(await field('Displacement')).toMatchObject({ value: '122.05', hint: '3.1–1220.4 ci' });
    expect(await suffixOf('Displacement')).toBe('ci');
    expect(await field('Injector flow')).toMatchObject({
      value: '54.2',
      hint: '1–985.4 lb/h for this fuel',
    });
    expect(await field('Tyre diameter')).toMatchObject({ value: '24.88', hint: '7.88–59.05 in' });
    expect(await suffixOf('Tyre diameter')).toBe('in');
  });

  it('When an imperial user saves without touching the numbers, then the stored metric values go back exactly', async () => {
    await open('imperial', VEHICLE);
    await press('Save changes');

    const request = http.expectOne({ method: 'PATCH', url: '/api/vehicles/v1' });
    const body = request.request.body as CreateVehicleInput;
    expect(body.engine.displacementL).toBe(2);
    expect(body.engine.injectorCcMin).toBe(550);
    expect(body.gearing.tireDiameterMm).toBe(631.9);
    request.flush(VEHICLE);
    expect(close).toHaveBeenCalledWith(VEHICLE);
  });

  it('When an imperial user types 350 ci, 60 lb/h and 25 in, then the API gets L, cc/min and mm', async () => {
    await open('imperial', null);
    await fillField(loader, 'Label', 'Test V8');
    await fillField(loader, 'Displacement', '350');
    await fillField(loader, 'Cylinders', '8');
    await fillField(loader, 'Injector flow', '60');
    await fillField(loader, 'Tyre diameter', '25');
    await fillField(loader, 'Gear ratios', '2.66, 1.78, 1.3, 1, 0.74, 0.5');
    await fillField(loader, 'Final drive', '3.42');
    await press('Create vehicle');

    const request = http.expectOne({ method: 'POST', url: '/api/vehicles' });
    const body = request.request.body as CreateVehicleInput;
    // 350 × 16.387064 cm³ = 5.7355 L; 60 lb/h × 453.59237 g / 60 min / 0.745 g/cc = 608.85 cc/min
    expect(body.engine.displacementL).toBeCloseTo(5.7354724, 6);
    expect(body.engine.injectorCcMin).toBeCloseTo(608.8488, 3);
    expect(body.gearing.tireDiameterMm).toBeCloseTo(635, 9);
    request.flush({ ...VEHICLE, id: 'v2' });
  });

  it('When an imperial user types a displacement below the range, then the message gives it in ci', async () => {
    await open('imperial', VEHICLE);
    await fillField(loader, 'Displacement', '2');
    expect(await (await formField('Displacement')).getTextErrors()).toEqual([
      'Displacement must be 3.1–1220.4 ci.',
    ]);
    await press('Save changes');
    http.expectNone('/api/vehicles/v1');
  });

  it('When an imperial user switches the fuel to E85, then lb/h is restated and the injector stays the same', async () => {
    await open('imperial', VEHICLE);
    const fuel = await loader.getHarness(MatSelectHarness);
    await fuel.open();
    await fuel.clickOptions({ text: 'E85' });

    // The same 550 cc/min injector at E85's 0.7824 g/cc flows 56.92 lb/h.
    expect((await field('Injector flow')).value).toBe('56.92');
    await press('Save changes');
    const body = http.expectOne('/api/vehicles/v1').request.body as CreateVehicleInput;
    expect(body.engine.injectorCcMin).toBe(550);
    expect(body.engine.fuel).toBe('e85');
  });

  it('When a vehicle is edited, then its fuel-safety settings show and go back unchanged', async () => {
    await open('metric', VEHICLE);
    expect(await field('Load line')).toMatchObject({ value: '95' });
    expect((await field('Load line')).hint).toMatch(/^50–150 %\. At or above this share/);
    expect(await suffixOf('Load line')).toBe('% of baro');
    expect(await field('Lean allowance')).toMatchObject({ value: '0.5' });

    await press('Save changes');
    const body = http.expectOne('/api/vehicles/v1').request.body as CreateVehicleInput;
    expect(body.fuelSafety).toEqual({ loadLinePercentOfBaro: 95, leanAllowancePercent: 0.5 });
  });

  it('When a vehicle is created, then the guard starts at 90 % and 1 % and a change is sent', async () => {
    await open('metric', null);
    expect((await field('Load line')).value).toBe('90');
    expect((await field('Lean allowance')).value).toBe('1');
    await fillField(loader, 'Label', 'Altitude car');
    await fillField(loader, 'Displacement', '2');
    await fillField(loader, 'Cylinders', '4');
    await fillField(loader, 'Injector flow', '550');
    await fillField(loader, 'Tyre diameter', '630');
    await fillField(loader, 'Gear ratios', '3.4, 1.9, 1.3');
    await fillField(loader, 'Final drive', '4.06');
    await fillField(loader, 'Lean allowance', '2');
    await press('Create vehicle');

    const request = http.expectOne({ method: 'POST', url: '/api/vehicles' });
    const body = request.request.body as CreateVehicleInput;
    expect(body.fuelSafety).toEqual({ loadLinePercentOfBaro: 90, leanAllowancePercent: 2 });
    request.flush({ ...VEHICLE, id: 'v3' });
  });

  it.each([
    ['Load line', '160', 'Load line must be 50–150 %.'],
    ['Lean allowance', '6', 'Lean allowance must be 0–5 %.'],
    ['Lean allowance', '', 'Enter the lean allowance in %.'],
  ])('When the %s is %j, then it says %j and nothing is sent', async (label, text, message) => {
    await open('metric', VEHICLE);
    await fillField(loader, label, text);
    expect(await (await formField(label)).getTextErrors()).toEqual([message]);
    await press('Save changes');
    http.expectNone('/api/vehicles/v1');
  });

  it('When the dialog is cancelled, then it closes with no vehicle and sends nothing', async () => {
    await open('imperial', VEHICLE);
    await press('Cancel');

    expect(close).toHaveBeenCalledWith();
    http.expectNone('/api/vehicles/v1');
  });
});
