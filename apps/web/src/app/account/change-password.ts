import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router } from '@angular/router';
import { Auth } from '../core/auth';
import { toProblem } from '../core/problem';
import { AccountApi } from './account-api';
import { PASSWORD_MAX, PASSWORD_MIN } from './account-types';
import { newPasswordError, samePasswords } from './new-password';

/**
 * A signed-in person changes their password: the current one, then the new one twice. Someone
 * who signed in with an invitation's password is sent here first (the role guard) and goes on
 * to where they were going (?next=) once the password is their own.
 */
@Component({
  selector: 'sl-change-password',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './change-password.html',
  styleUrl: './change-password.scss',
})
export class ChangePassword {
  private readonly api = inject(AccountApi);
  private readonly auth = inject(Auth);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);
  /** Where to go once an invitation's password is replaced. */
  readonly next = input<string>();

  protected readonly min = PASSWORD_MIN;
  protected readonly max = PASSWORD_MAX;
  protected readonly form = this.fb.group({
    current: ['', Validators.required],
    fresh: this.fb.group(
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
    ),
  });
  /** Set when the user signed in with the password they were sent. */
  protected readonly forced = computed(() => this.auth.user()?.mustChangePassword === true);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly done = signal(false);
  protected readonly newPasswordError = newPasswordError;

  protected submit(): void {
    this.done.set(false);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { current, fresh } = this.form.getRawValue();
    const forced = this.forced();
    this.busy.set(true);
    this.error.set(null);
    this.api.changePassword({ currentPassword: current, newPassword: fresh.password }).subscribe({
      next: (user) => {
        this.busy.set(false);
        this.auth.updateUser(user);
        this.form.reset();
        if (forced) {
          const next = this.next();
          void this.router.navigateByUrl(next && next.startsWith('/') ? next : '/projects');
        } else {
          this.done.set(true);
        }
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const p = toProblem(err);
        this.error.set(p.detail ?? p.title);
      },
    });
  }
}
