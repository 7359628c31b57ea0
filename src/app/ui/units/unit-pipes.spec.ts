import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { MixtureDisplay, UnitSystem } from '@shared/contracts/preferences';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { MixturePipe } from './mixture-pipe';
import { QuantityPipe } from './quantity-pipe';
import { UnitLabelPipe } from './unit-label-pipe';

/** An OnPush host showing one value through each pipe. */
@Component({
  selector: 'app-pipes-host',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [QuantityPipe, MixturePipe, UnitLabelPipe],
  template: `
    <span class="map">{{ 101.325 | quantity: 'pressure' }}</span>
    <span class="bare">{{ 250 | quantity: 'pressure' : { unit: false } }}</span>
    <span class="flow">{{ 1000 | quantity: 'injectorFlow' : { fuel: 'e85' } }}</span>
    <span class="missing">{{ null | quantity: 'speed' }}</span>
    <span class="lambda">{{ 0.85 | mixture: 14.7 }}</span>
    <span class="header">{{ 'pressure' | unitLabel }} / {{ 'mixture' | unitLabel }}</span>
  `,
})
class PipesHost {}

describe('quantity, mixture and unitLabel pipes', () => {
  const units = signal<UnitSystem>('metric');
  const mixture = signal<MixtureDisplay>('lambda');

  beforeEach(() => {
    units.set('metric');
    mixture.set('lambda');
    TestBed.configureTestingModule({
      providers: [{ provide: DisplayPreferences, useValue: { units, mixture } }],
    });
  });

  /** The text of each span of the host, by class. */
  async function texts(): Promise<Record<string, string>> {
    const fixture = TestBed.createComponent(PipesHost);
    await fixture.whenStable();
    return read(fixture.nativeElement as HTMLElement);
  }

  function read(host: HTMLElement): Record<string, string> {
    return Object.fromEntries(
      [...host.querySelectorAll('span')].map((span) => [span.className, span.textContent ?? '']),
    );
  }

  it('When the user wants metric and lambda, then values read in kPa, cc/min and λ', async () => {
    expect(await texts()).toEqual({
      map: '101.3 kPa',
      bare: '250',
      flow: '1000 cc/min',
      missing: '—',
      lambda: '0.85 λ',
      header: 'kPa / λ',
    });
  });

  it('When the user wants imperial and AFR, then values read in psi(a), lb/h and AFR', async () => {
    units.set('imperial');
    mixture.set('afr');
    expect(await texts()).toEqual({
      map: '14.7 psi(a)',
      bare: '36.26',
      flow: '103.5 lb/h',
      missing: '—',
      lambda: '12.5 AFR',
      header: 'psi(a) / AFR',
    });
  });

  it('When the preference changes on a shown page, then the OnPush view follows', async () => {
    const fixture = TestBed.createComponent(PipesHost);
    await fixture.whenStable();
    units.set('imperial');
    mixture.set('afr');
    await fixture.whenStable();

    const shown = read(fixture.nativeElement as HTMLElement);
    expect(shown['map']).toBe('14.7 psi(a)');
    expect(shown['lambda']).toBe('12.5 AFR');
  });
});
