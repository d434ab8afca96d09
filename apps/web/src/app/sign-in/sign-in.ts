import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { Auth } from '../core/auth';
import { toProblem } from '../core/problem';

/**
 * Sign-in with e-mail and password; back to where the user was going (?next=) after (by way of
 * choosing their own password, when they signed in with an invitation's: the role guard).
 */
@Component({
  selector: 'sl-sign-in',
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
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
})
export class SignIn {
  private readonly auth = inject(Auth);
  private readonly router = inject(Router);
  /** Where to go after signing in (from the guard or the 401 handler). */
  readonly next = input<string>();
  /** Set when a 401 sent the user here. */
  readonly expired = input<string>();

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, password } = this.form.getRawValue();
    this.busy.set(true);
    this.error.set(null);
    this.auth.signIn(email, password).subscribe({
      next: () => {
        this.busy.set(false);
        const next = this.next();
        void this.router.navigateByUrl(next && next.startsWith('/') ? next : '/projects');
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const p = toProblem(err);
        this.error.set(p.detail ?? p.title);
      },
    });
  }
}
