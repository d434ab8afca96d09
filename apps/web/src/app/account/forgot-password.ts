import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { toProblem } from '../core/problem';
import { AccountApi } from './account-api';
import type { ResetAsked } from './account-types';

/**
 * Someone who forgot their password asks for a link to set a new one, by their e-mail
 * address. The answer is the same whether or not the address has an account.
 */
@Component({
  selector: 'sl-forgot-password',
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
  templateUrl: './forgot-password.html',
  styleUrl: './forgot-password.scss',
})
export class ForgotPassword {
  private readonly api = inject(AccountApi);

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly asked = signal<ResetAsked | null>(null);

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.api.askForReset(this.form.getRawValue().email).subscribe({
      next: (answer) => {
        this.busy.set(false);
        this.asked.set(answer);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const p = toProblem(err);
        this.error.set(p.detail ?? p.title);
      },
    });
  }
}
