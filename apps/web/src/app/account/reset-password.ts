import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { toProblem } from '../core/problem';
import { AccountApi } from './account-api';
import { PASSWORD_MAX, PASSWORD_MIN } from './account-types';
import { newPasswordError, samePasswords } from './new-password';

/**
 * The token of a reset link, from the address's fragment (`#token=…`): the part of an address
 * a browser never sends to a server, so the token stays out of every access log.
 */
export function tokenOf(fragment: string | null): string | null {
  if (!fragment) return null;
  const token = new URLSearchParams(fragment).get('token');
  return token && /^slr_[\w-]{20,200}$/.test(token) ? token : null;
}

/** The page a mailed reset link opens: a new password, twice; then sign in with it. */
@Component({
  selector: 'sl-reset-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './reset-password.html',
  styleUrl: './reset-password.scss',
})
export class ResetPassword {
  private readonly api = inject(AccountApi);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly token = tokenOf(inject(ActivatedRoute).snapshot.fragment);
  protected readonly min = PASSWORD_MIN;
  protected readonly max = PASSWORD_MAX;
  protected readonly form = this.fb.group(
    {
      password: [
        '',
        [
          Validators.required,
          Validators.minLength(PASSWORD_MIN),
          Validators.maxLength(PASSWORD_MAX),
        ],
      ],
      repeat: ['', Validators.required],
    },
    { validators: samePasswords },
  );
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  /** The account's address once the password is set. */
  protected readonly doneFor = signal<string | null>(null);
  protected readonly newPasswordError = newPasswordError;

  protected submit(): void {
    if (!this.token) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.api.reset(this.token, this.form.getRawValue().password).subscribe({
      next: (done) => {
        this.busy.set(false);
        this.doneFor.set(done.email);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const p = toProblem(err);
        this.error.set(p.detail ?? p.title);
      },
    });
  }
}
