import { ChangeDetectionStrategy, Component, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { BlendDirection, CellOperation } from './cell-operations';

/** A choice of the "Blend across" menu. */
interface BlendChoice {
  /** Which way it blends. */
  readonly direction: BlendDirection;
  /** The menu text. */
  readonly label: string;
}

/**
 * The cell operations on the grid's selection: an amount with scale, offset and set; blend
 * across, smooth and fill gaps; lock and unlock. It only reports what was asked for: the store
 * runs the operation as one undo step and explains a refusal.
 */
@Component({
  selector: 'app-cell-ops-bar',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatTooltipModule,
  ],
  templateUrl: './cell-ops-bar.html',
  styleUrl: './cell-ops-bar.scss',
})
export class CellOpsBar {
  /** Whether the operations are unavailable (no selection, or an overlay other than VE). */
  readonly disabled = input(false);
  /** Why they are unavailable, shown beside the bar; empty when they are available. */
  readonly hint = input('');
  /** Run an operation on the selected cells. */
  readonly operate = output<CellOperation>();
  /** Lock (true) or unlock (false) the selected cells. */
  readonly lock = output<boolean>();

  /** The amount for scale (percent), offset (VE points) and set (VE %). */
  protected readonly amount = signal<number | null>(5);

  /** The "Blend across" choices. */
  protected readonly blends: readonly BlendChoice[] = [
    { direction: 'rows', label: 'Along rows (left → right edge)' },
    { direction: 'cols', label: 'Along columns (top → bottom edge)' },
    { direction: 'both', label: 'Both, from the four corners' },
  ];

  /** Scales the selection by the amount in percent. */
  protected scale(): void {
    this.operate.emit({ kind: 'scale', percent: this.amountValue() });
  }

  /** Adds the amount in VE points to the selection. */
  protected offset(): void {
    this.operate.emit({ kind: 'offset', points: this.amountValue() });
  }

  /** Sets the selection to the amount. */
  protected set(): void {
    this.operate.emit({ kind: 'set', value: this.amountValue() });
  }

  /** Blends the selection between its edges. */
  protected blend(direction: BlendDirection): void {
    this.operate.emit({ kind: 'blend', direction });
  }

  /** Smooths the selection. */
  protected smooth(): void {
    this.operate.emit({ kind: 'smooth' });
  }

  /** Fills the selection from the cells around it. */
  protected fillGaps(): void {
    this.operate.emit({ kind: 'fillGaps' });
  }

  /** An empty field is NaN, which the operation refuses with a sentence. */
  private amountValue(): number {
    const value = this.amount();
    return value === null ? NaN : Number(value);
  }
}
