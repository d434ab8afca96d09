import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule } from '@angular/material/dialog';
import { map, type Observable } from 'rxjs';

export interface ConfirmData {
  title: string;
  message: string;
  /** The words on the button that goes ahead, e.g. "Disable". */
  confirm: string;
}

/** Asks before an admin action that takes something away (disable a user, revoke a token). */
@Component({
  selector: 'sl-confirm-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content>
      <p>{{ data.message }}</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Cancel</button>
      <button mat-flat-button type="button" data-testid="confirm" [mat-dialog-close]="true">
        {{ data.confirm }}
      </button>
    </mat-dialog-actions>
  `,
})
export class ConfirmDialog {
  protected readonly data = inject<ConfirmData>(MAT_DIALOG_DATA);
}

/** Opens the confirmation; emits true once when the admin goes ahead, false otherwise. */
export function confirmAction(dialog: MatDialog, data: ConfirmData): Observable<boolean> {
  return dialog
    .open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data,
      width: 'min(460px, 92vw)',
      // Focus starts on Cancel: Enter alone never takes anything away.
      autoFocus: 'first-tabbable',
      restoreFocus: true,
    })
    .afterClosed()
    .pipe(map((r) => r === true));
}
