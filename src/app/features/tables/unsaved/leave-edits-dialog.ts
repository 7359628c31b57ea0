import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';

/** What the leave question is opened with. */
export interface LeaveEditsData {
  /** How many cells differ from the saved revision. */
  readonly editedCells: number;
}

/**
 * Asks before the workspace is left with unsaved edits: "Leave and discard" closes with true,
 * "Stay" (or Escape, or a click outside) with false or nothing.
 */
@Component({
  selector: 'app-leave-edits-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule],
  template: `
    <h2 mat-dialog-title>Leave with unsaved edits?</h2>
    <mat-dialog-content>
      <p>
        {{ data.editedCells === 1 ? '1 cell has' : data.editedCells + ' cells have' }} edits that
        are not saved as a revision. Leaving discards them.
      </p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="true">Leave and discard</button>
      <button mat-flat-button type="button" [mat-dialog-close]="false" cdkFocusInitial>Stay</button>
    </mat-dialog-actions>
  `,
})
export class LeaveEditsDialog {
  /** The count told. */
  protected readonly data = inject<LeaveEditsData>(MAT_DIALOG_DATA);
}
