import type { HarnessLoader } from '@angular/cdk/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { Provider } from '@angular/core';

/** Spec helper: types `value` into the input of the form field labelled `label`. */
export async function fillField(
  loader: HarnessLoader,
  label: string,
  value: string,
): Promise<void> {
  const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  const control = await field.getControl(MatInputHarness);
  if (control === null) throw new Error(`fillField: the field "${label}" has no matInput`);
  await control.setValue(value);
  await control.blur();
}

/** Spec helper: turns Material's animations off so overlays open and close at once. */
export const noAnimations: Provider = {
  provide: MATERIAL_ANIMATIONS,
  useValue: { animationsDisabled: true },
};
