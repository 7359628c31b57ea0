import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { ColumnMappingInput } from '@shared/contracts/logs';
import { sniffCsv } from '@shared/import/sniff-csv';
import { suggestMapping } from '@shared/import/suggest-mapping';
import { noAnimations } from '../../../testing/harness-helpers';
import { MappingDialog, type MappingDialogData } from './mapping-dialog';

/** Invented names: only engine_rpm is sure, manifold_x a weak MAP guess, the rest unknown. */
const HEAD = [
  'clock_s,engine_rpm,manifold_x,probe_a,probe_a_aim',
  '0.00,900,35.2,14.8,14.7',
  '0.05,905,35.0,14.9,14.7',
].join('\n');

/** Opens the dialog the way the upload does and keeps what it closes with. */
@Component({
  selector: 'app-dialog-host',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '',
})
class DialogHost {
  private readonly dialog = inject(MatDialog);
  /** What the dialog closed with; null while open. */
  result: ColumnMappingInput | undefined | null = null;

  open(): void {
    const sniff = sniffCsv(HEAD);
    const data: MappingDialogData = {
      fileName: 'odd.csv',
      vehicleLabel: 'Demo hatch',
      stoichAfr: 14.7,
      sniff,
      suggestion: suggestMapping(sniff),
    };
    this.dialog
      .open<MappingDialog, MappingDialogData, ColumnMappingInput>(MappingDialog, { data })
      .afterClosed()
      .subscribe((result) => (this.result = result));
  }
}

describe('MappingDialog', () => {
  let fixture: ComponentFixture<DialogHost>;
  let root: HarnessLoader;

  /** The channel select of the column named `name`. */
  const channelOf = (name: string) =>
    root.getHarness(MatSelectHarness.with({ selector: `.channel-select[data-column="${name}"]` }));

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [noAnimations] });
    fixture = TestBed.createComponent(DialogHost);
    root = TestbedHarnessEnvironment.documentRootLoader(fixture);
    fixture.componentInstance.open();
    await fixture.whenStable();
  });

  it('When it opens, then the suggestion is pre-filled, the weak guess marked, the missing named', async () => {
    expect(await (await channelOf('engine_rpm')).getValueText()).toBe('Engine speed (RPM)');
    expect(await (await channelOf('manifold_x')).getValueText()).toBe('MAP (absolute)');
    expect(await (await channelOf('clock_s')).getValueText()).toBe('ignore');
    const dialog = await root.getHarness(MatDialogHarness);
    const text = await (await dialog.host()).text();
    expect(text).toContain('check · guessed 42 %');
    expect(text).toContain('suggested · 95 %');
    expect(text).toContain('Time: no column chosen');
    expect(text).toContain('saves it as the shop’s mapping');
    const confirm = await root.getHarness(MatButtonHarness.with({ text: 'Confirm and upload' }));
    expect(await confirm.isDisabled()).toBe(true);
  });

  it('When RPM is chosen for two columns, then that is named and confirming stays off', async () => {
    await (await channelOf('probe_a')).clickOptions({ text: 'Engine speed (RPM)' });
    const text = await (await (await root.getHarness(MatDialogHarness)).host()).text();
    expect(text).toContain('chosen for engine_rpm, probe_a: keep one');
    expect(text).toContain('Engine speed (RPM) is chosen for 2 columns: engine_rpm, probe_a.');
  });

  it('When every column is mapped (AFR in a fitting unit), then it closes with the mapping', async () => {
    await (await channelOf('clock_s')).clickOptions({ text: 'Time' });
    await (await channelOf('probe_a')).clickOptions({ text: 'Measured lambda / AFR' });
    await (await channelOf('probe_a_aim')).clickOptions({ text: 'Commanded lambda / AFR' });
    for (const name of ['probe_a', 'probe_a_aim']) {
      const unit = await root.getHarness(
        MatSelectHarness.with({ selector: `.unit-select[data-column="${name}"]` }),
      );
      expect(await unit.getValueText()).toBe('lambda (λ)');
      await unit.clickOptions({ text: 'AFR' });
    }
    const dialog = await root.getHarness(MatDialogHarness);
    expect(await (await dialog.host()).text()).toContain('stoichiometric AFR, 14.7');

    await (await root.getHarness(MatButtonHarness.with({ text: 'Confirm and upload' }))).click();
    await fixture.whenStable();
    expect(fixture.componentInstance.result).toEqual({
      channels: {
        time: { column: 'clock_s', unit: 's' },
        rpm: { column: 'engine_rpm' },
        map: { column: 'manifold_x', unit: 'kPa' },
        lambda: { column: 'probe_a', unit: 'afr' },
        lambdaTarget: { column: 'probe_a_aim', unit: 'afr' },
      },
    });
  });

  it('When it is cancelled, then it closes without a mapping', async () => {
    await (await root.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    await fixture.whenStable();
    expect(fixture.componentInstance.result).toBeUndefined();
  });
});
