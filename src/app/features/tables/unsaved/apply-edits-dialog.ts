import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';

/** What the user chose when applying with unsaved edits; null or undefined is "Cancel". */
export type ApplyEditsChoice = 'save-first' | 'discard';

/** What the apply question is opened with. */
export interface ApplyEditsData {
  /** How many cells differ from the saved revision. */
  readonly editedCells: number;
  /** How many of them are locked (their edited value is what the user means to keep). */
  readonly lockedEdited: number;
  /** The number of the revision the analysis shown was run on. */
  readonly baseNumber: number | null;
}

/** "3 cells", "1 cell". */
function cells(n: number): string {
  return n === 1 ? '1 cell' : `${n} cells`;
}

/**
 * Asked when "Apply as draft" is pressed while the grid holds unsaved edits, since the server
 * applies to a saved revision: save the edits as a draft revision and apply on top of them (a new
 * analysis of the same logs and settings runs on that revision first), discard them and apply
 * to the analysed revision, or cancel. Closes with an {@link ApplyEditsChoice}, or nothing.
 */
@Component({
  selector: 'app-apply-edits-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule],
  template: `
    <h2 mat-dialog-title>Apply with unsaved edits?</h2>
    <mat-dialog-content>
      <p data-testid="apply-edits-count">
        {{ edited }} of the grid {{ data.editedCells === 1 ? 'is' : 'are' }} edited but not saved.
        An analysis applies to a saved revision, so these edits would not be in the draft.
      </p>
      @if (data.lockedEdited > 0) {
        <p data-testid="apply-edits-locked">
          {{ lockedEdited }} locked {{ data.lockedEdited === 1 ? 'shows' : 'show' }} an edited
          value: saving first keeps what the grid shows there.
        </p>
      }
      <p>
        Saving first stores the edits as a revision, analyses the same logs with the same settings
        against it, and applies that analysis with the options chosen.
      </p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="null">Cancel</button>
      <button mat-button type="button" [mat-dialog-close]="discard">
        Discard the edits and apply to revision {{ data.baseNumber }}
      </button>
      <button mat-flat-button type="button" [mat-dialog-close]="saveFirst" cdkFocusInitial>
        Save your edits as a draft first, then apply on top of them
      </button>
    </mat-dialog-actions>
  `,
})
export class ApplyEditsDialog {
  /** The counts and revision told. */
  protected readonly data = inject<ApplyEditsData>(MAT_DIALOG_DATA);
  /** The edited cells in words. */
  protected readonly edited = cells(this.data.editedCells);
  /** The locked edited cells in words. */
  protected readonly lockedEdited = cells(this.data.lockedEdited);
  /** The choices' values. */
  protected readonly saveFirst: ApplyEditsChoice = 'save-first';
  protected readonly discard: ApplyEditsChoice = 'discard';
}
