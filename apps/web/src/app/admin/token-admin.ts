import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  type ElementRef,
  inject,
  Injector,
  linkedSignal,
  signal,
  viewChild,
} from '@angular/core';
import { Clipboard } from '@angular/cdk/clipboard';
import { DatePipe } from '@angular/common';
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
import { BehaviorSubject, filter, forkJoin, switchMap } from 'rxjs';
import type { Problem, Project } from '../core/models';
import { toProblem } from '../core/problem';
import { loadState, type Loaded, valueOf } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { AdminApi, type AdminUser, type ApiToken, type CreatedToken } from './admin-api';
import { AdminNotice, type Notice, refused } from './admin-notice';
import { confirmAction } from './confirm-dialog';

const DAY_MS = 24 * 3600 * 1000;
export const MAX_DAYS = 3650;

interface TokenPage {
  tokens: ApiToken[];
  users: AdminUser[];
  projects: Project[];
}

/** A token's state in words: revoked, expired or active (at `now`). */
export function tokenState(t: ApiToken, now = Date.now()): 'revoked' | 'expired' | 'active' {
  if (t.revokedAt) return 'revoked';
  return new Date(t.expiresAt).getTime() <= now ? 'expired' : 'active';
}

/**
 * The integration tokens (admin only): which system may use the API for which projects, until
 * when. A new token is shown once, right after it is made; the API keeps only a hash of it.
 */
@Component({
  selector: 'sl-token-admin',
  imports: [
    DatePipe,
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
  templateUrl: './token-admin.html',
  styleUrl: './token-admin.scss',
})
export class TokenAdmin {
  private readonly api = inject(AdminApi);
  private readonly dialog = inject(MatDialog);
  private readonly clipboard = inject(Clipboard);
  private readonly injector = inject(Injector);
  private readonly reloads = new BehaviorSubject<void>(undefined);
  private readonly onceBox = viewChild<ElementRef<HTMLElement>>('onceBox');
  private readonly formDirective = viewChild(FormGroupDirective);

  protected readonly maxDays = MAX_DAYS;
  protected readonly columns = [
    'name',
    'user',
    'projects',
    'created',
    'expires',
    'lastUsed',
    'state',
    'actions',
  ];

  protected readonly loaded = toSignal(
    this.reloads.pipe(
      switchMap(() =>
        loadState(
          forkJoin({
            tokens: this.api.tokens(),
            users: this.api.users(),
            projects: this.api.projects(),
          }),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } satisfies Loaded<TokenPage> },
  );
  private readonly data = computed(() => valueOf(this.loaded()));
  /** The listed tokens, with the ones made or revoked on this page since. */
  protected readonly tokens = linkedSignal(() => this.data()?.tokens ?? []);
  protected readonly problem = computed(() => {
    const l = this.loaded();
    return l.state === 'error' ? l.problem : null;
  });
  protected readonly pageState = computed(() => {
    const l = this.loaded();
    if (l.state !== 'ready') return l.state;
    return this.tokens().length === 0 ? 'empty' : 'ready';
  });
  protected readonly integrationUsers = computed(() =>
    (this.data()?.users ?? []).filter((u) => u.role === 'integration' && u.active),
  );
  protected readonly projects = computed(() => this.data()?.projects ?? []);
  private readonly usersById = computed(
    () => new Map((this.data()?.users ?? []).map((u) => [u.id, u])),
  );
  private readonly projectsById = computed(
    () => new Map(this.projects().map((p) => [p.id, p.name])),
  );

  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    userId: this.fb.control<number | null>(null, Validators.required),
    name: ['', [Validators.required, Validators.maxLength(255)]],
    projectIds: this.fb.control<number[]>([], Validators.required),
    days: [
      365,
      [
        Validators.required,
        Validators.min(1),
        Validators.max(MAX_DAYS),
        Validators.pattern(/^\d+$/),
      ],
    ],
  });
  private readonly days = toSignal(this.form.controls.days.valueChanges, {
    initialValue: this.form.controls.days.value,
  });
  protected readonly expiresOn = computed(() => {
    const d = Number(this.days());
    return Number.isInteger(d) && d >= 1 && d <= MAX_DAYS
      ? new Date(Date.now() + d * DAY_MS)
      : null;
  });

  protected readonly creating = signal(false);
  protected readonly createProblem = signal<Problem | null>(null);
  /** The token just made: in memory only until the admin closes the box. */
  protected readonly created = signal<CreatedToken | null>(null);
  protected readonly copied = signal<boolean | null>(null);
  protected readonly notice = signal<Notice | null>(null);
  protected readonly revoking = signal<number | null>(null);

  protected readonly byId = (_: number, t: ApiToken) => t.id;

  protected reload(): void {
    this.reloads.next();
  }

  protected userOf(t: ApiToken): string {
    const u = this.usersById().get(t.userId);
    return u ? u.name : `user ${t.userId}`;
  }

  protected projectsOf(t: ApiToken): string {
    if (t.projectIds === null) return 'all projects';
    if (t.projectIds.length === 0) return 'none';
    return t.projectIds.map((id) => this.projectsById().get(id) ?? `project ${id}`).join(', ');
  }

  protected stateOf(t: ApiToken): 'revoked' | 'expired' | 'active' {
    return tokenState(t);
  }

  protected create(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    this.creating.set(true);
    this.createProblem.set(null);
    this.notice.set(null);
    this.api
      .createToken({
        userId: v.userId as number,
        name: v.name.trim(),
        projectIds: v.projectIds,
        days: Number(v.days),
      })
      .subscribe({
        next: (t) => {
          this.creating.set(false);
          this.copied.set(null);
          this.created.set(t);
          const { token: _secret, ...row } = t;
          this.tokens.update((list) => [...list, row]);
          // Also clears "submitted", so the emptied fields are not shown as errors.
          this.formDirective()?.resetForm();
          afterNextRender(() => this.onceBox()?.nativeElement.focus(), {
            injector: this.injector,
          });
        },
        error: (err: unknown) => {
          this.creating.set(false);
          this.createProblem.set(toProblem(err));
        },
      });
  }

  protected copy(token: string): void {
    this.copied.set(this.clipboard.copy(token));
  }

  /** Forgets the token: from here on nobody can see it again. */
  protected closeOnce(): void {
    this.created.set(null);
    this.copied.set(null);
  }

  protected revoke(t: ApiToken): void {
    const name = t.name ?? `token ${t.id}`;
    confirmAction(this.dialog, {
      title: `Revoke “${name}”?`,
      message: `${this.userOf(t)} can no longer use the API with this token, from the next request on. This cannot be undone: a new token has to be made and handed over instead.`,
      confirm: 'Revoke',
    })
      .pipe(filter(Boolean))
      .subscribe(() => {
        this.revoking.set(t.id);
        this.notice.set(null);
        this.api.revokeToken(t.id).subscribe({
          next: (row) => {
            this.revoking.set(null);
            this.tokens.update((list) => list.map((x) => (x.id === row.id ? row : x)));
            this.notice.set({ ok: true, text: `“${name}” is revoked.` });
          },
          error: (err: unknown) => {
            this.revoking.set(null);
            this.notice.set(refused(`“${name}” was not revoked`, err));
          },
        });
      });
  }
}
