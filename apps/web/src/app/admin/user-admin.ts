import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  linkedSignal,
  signal,
  viewChild,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import {
  FormGroupDirective,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { BehaviorSubject, filter, switchMap } from 'rxjs';
import { Auth } from '../core/auth';
import type { Problem, Role } from '../core/models';
import { toProblem } from '../core/problem';
import { loadState, type Loaded, valueOf } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { AdminApi, type AdminUser, type Invited } from './admin-api';
import { AdminNotice, type Notice, refused } from './admin-notice';
import { confirmAction } from './confirm-dialog';

/** What each role may do, in the words the invite form and the table show. */
export const ROLE_TEXT: Record<Role, string> = {
  admin: 'Users, API tokens and everything the others may do',
  engineer: 'Projects, sections and batches: submits and reruns',
  reviewer: 'Signs off or returns results, never their own',
  viewer: 'Reads projects and results',
  integration: 'Another system: API tokens only, never signs in',
};

/** The roles of people (who sign in); integration users hold API tokens only. */
export const PERSON_ROLES: readonly Role[] = ['admin', 'engineer', 'reviewer', 'viewer'];

/** What the last invitation came to. */
export type InviteOutcome =
  | { kind: 'sent'; email: string }
  | { kind: 'password'; name: string; email: string; password: string }
  | { kind: 'integration'; name: string }
  | { kind: 'error'; problem: Problem };

export function inviteOutcome(u: Invited): InviteOutcome {
  if (u.role === 'integration') return { kind: 'integration', name: u.name };
  if (u.invited === false && u.password) {
    return { kind: 'password', name: u.name, email: u.email, password: u.password };
  }
  return { kind: 'sent', email: u.email };
}

/** Why a control of this row is off, or null when the admin may use it. */
export function lockReason(user: AdminUser, myId: number | undefined): string | null {
  if (user.id === myId) return 'This is you: you cannot disable or demote yourself.';
  return null;
}

/**
 * The users (admin only): invite one (a one-time password goes out by mail), change a role,
 * disable or enable an account. Nobody disables or demotes themselves.
 */
@Component({
  selector: 'sl-user-admin',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    PageState,
    AdminNotice,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './user-admin.html',
  styleUrl: './user-admin.scss',
})
export class UserAdmin {
  private readonly api = inject(AdminApi);
  private readonly auth = inject(Auth);
  private readonly dialog = inject(MatDialog);
  private readonly reloads = new BehaviorSubject<void>(undefined);
  private readonly formDirective = viewChild(FormGroupDirective);

  protected readonly roleText = ROLE_TEXT;
  protected readonly personRoles = PERSON_ROLES;
  protected readonly allRoles: readonly Role[] = [...PERSON_ROLES, 'integration'];
  protected readonly columns = ['name', 'email', 'role', 'active', 'actions'];

  protected readonly loaded = toSignal(
    this.reloads.pipe(switchMap(() => loadState(this.api.users()))),
    { initialValue: { state: 'loading' } satisfies Loaded<AdminUser[]> },
  );
  /** The listed users, with the changes made on this page since. */
  protected readonly rows = linkedSignal(() => valueOf(this.loaded()) ?? []);
  protected readonly pageState = computed(() => {
    const l = this.loaded();
    if (l.state !== 'ready') return l.state;
    return l.value.length === 0 ? 'empty' : 'ready';
  });
  protected readonly problem = computed(() => {
    const l = this.loaded();
    return l.state === 'error' ? l.problem : null;
  });
  protected readonly myId = computed(() => this.auth.user()?.id);
  /** Users with a change on its way to the API. */
  protected readonly pending = signal<ReadonlySet<number>>(new Set());
  /** The outcome of the last change in the table. */
  protected readonly notice = signal<Notice | null>(null);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(255)]],
    email: ['', [Validators.required, Validators.email, Validators.maxLength(255)]],
    role: ['engineer' as Role, Validators.required],
  });
  protected readonly inviting = signal(false);
  protected readonly outcome = signal<InviteOutcome | null>(null);
  protected readonly chosenRole = toSignal(this.form.controls.role.valueChanges, {
    initialValue: this.form.controls.role.value,
  });

  protected readonly byId = (_: number, u: AdminUser) => u.id;

  protected reload(): void {
    this.reloads.next();
  }

  protected lockReason(user: AdminUser): string | null {
    return lockReason(user, this.myId());
  }

  protected isPending(user: AdminUser): boolean {
    return this.pending().has(user.id);
  }

  protected invite(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const body = this.form.getRawValue();
    this.inviting.set(true);
    this.outcome.set(null);
    this.api.invite({ ...body, name: body.name.trim(), email: body.email.trim() }).subscribe({
      next: (u) => {
        this.inviting.set(false);
        this.outcome.set(inviteOutcome(u));
        this.rows.update((list) => [...list, u]);
        // Also clears "submitted", so the emptied fields are not shown as errors.
        this.formDirective()?.resetForm({ name: '', email: '', role: body.role });
      },
      error: (err: unknown) => {
        this.inviting.set(false);
        // The form keeps what was typed, to correct and send again.
        this.outcome.set({ kind: 'error', problem: toProblem(err) });
      },
    });
  }

  protected changeRole(user: AdminUser, role: Role): void {
    if (role === user.role) return;
    const before = user.role;
    this.replace({ ...user, role });
    this.send(
      user,
      { role },
      (u) => `${u.name} is now ${u.role}.`,
      () => this.replace({ ...user, role: before }),
    );
  }

  protected toggleActive(user: AdminUser): void {
    const active = !user.active;
    confirmAction(
      this.dialog,
      active
        ? {
            title: `Enable ${user.name}?`,
            message: `${user.name} (${user.email}) may sign in again, and their API tokens work again until they expire or are revoked.`,
            confirm: 'Enable',
          }
        : {
            title: `Disable ${user.name}?`,
            message: `${user.name} (${user.email}) is signed out at once and cannot sign in; their API tokens are refused until the account is enabled again. Their results and reviews stay.`,
            confirm: 'Disable',
          },
    )
      .pipe(filter(Boolean))
      .subscribe(() =>
        this.send(
          user,
          { active },
          (u) => (u.active ? `${u.name} is enabled.` : `${u.name} is disabled.`),
          () => undefined,
        ),
      );
  }

  private send(
    user: AdminUser,
    changes: { role?: Role; active?: boolean },
    said: (u: AdminUser) => string,
    undo: () => void,
  ): void {
    this.pending.update((s) => new Set(s).add(user.id));
    this.notice.set(null);
    const done = () =>
      this.pending.update((s) => {
        const next = new Set(s);
        next.delete(user.id);
        return next;
      });
    this.api.updateUser(user.id, changes).subscribe({
      next: (u) => {
        done();
        this.replace(u);
        this.notice.set({ ok: true, text: said(u) });
      },
      error: (err: unknown) => {
        done();
        undo();
        this.notice.set(refused(`${user.name} was not changed`, err));
      },
    });
  }

  private replace(u: AdminUser): void {
    this.rows.update((list) => list.map((r) => (r.id === u.id ? u : r)));
  }
}
