import { inject } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import type { CanDeactivateFn } from '@angular/router';
import { type Observable, map } from 'rxjs';
import { LeaveEditsDialog, type LeaveEditsData } from './leave-edits-dialog';

/** A page that may hold edits not saved yet. */
export interface HoldsUnsavedEdits {
  /** How many cells differ from what is saved (0: nothing would be lost by leaving). */
  unsavedCellCount(): number;
}

/**
 * Route guard of the table workspace: leaving with unsaved edits (the menu, a link, the back
 * button) asks first, "Leave and discard" or "Stay"; with none it lets the user go at once.
 */
export const unsavedEditsGuard: CanDeactivateFn<HoldsUnsavedEdits> = (
  page,
): true | Observable<boolean> => {
  const editedCells = page.unsavedCellCount();
  if (editedCells === 0) return true;
  return inject(MatDialog)
    .open<LeaveEditsDialog, LeaveEditsData, boolean>(LeaveEditsDialog, {
      data: { editedCells },
      autoFocus: 'dialog',
    })
    .afterClosed()
    .pipe(map((leave) => leave === true));
};
