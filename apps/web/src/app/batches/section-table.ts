import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { EMPTY, switchMap } from 'rxjs';
import type { Problem } from '../core/models';
import { loadState } from '../shared/load-state';
import type {
  SectionListCase,
  SectionListItem,
  SectionPage,
  SectionQuery,
  SectionSort,
  SectionStatus,
} from './batch-types';
import { betaText, probabilityText, worstCase } from '../studies/probability-format';
import type { ProbabilitySummary } from '../studies/study-types';
import { BatchesApi } from './batches-api';
import { keepLast, nothingYet } from './keep-last';
import { caseKindWords } from '../shared/case-kinds';
import { hasVerdict, type BatchCase } from './design-cases';
import { formatChainage, formatFs, formatRatio } from './scales';
import { methodName } from '../shared/method-names';
import { JOB_STATE_WORDS, JOB_STATES } from '@scarpline/core/verdict';
import { capitalised, verdictView } from '../shared/verdict';
import { verdictOfItem } from './words';

/** The verdict filter: every section, or those with this verdict. */
export type VerdictFilter = 'all' | 'meets' | 'below' | 'no-slope';

/**
 * The sections matching a text (station, its label, the key or the title), a run status and
 * a verdict (the station's, or with `caseName` that case's), as the server sorts.
 */
export function filterSections(
  all: readonly SectionListItem[],
  f: {
    text: string;
    verdict: VerdictFilter;
    status: SectionStatus | '';
    caseName?: string | null;
  },
  sort: { active: SectionSort; direction: 'asc' | 'desc' },
): SectionListItem[] {
  const t = f.text.trim().toLowerCase();
  const rows = all.filter((s) => {
    if (f.status && s.status !== f.status) return false;
    if (f.verdict !== 'all' && !hasVerdict(s, f.verdict, f.caseName ?? null)) return false;
    if (!t) return true;
    return (
      s.key.toLowerCase().includes(t) ||
      s.title.toLowerCase().includes(t) ||
      (s.stationLabel ?? '').toLowerCase().includes(t) ||
      (s.station !== null && String(s.station).includes(t))
    );
  });
  const value = (s: SectionListItem) =>
    sort.active === 'fs'
      ? (s.result?.governingFs ?? null)
      : sort.active === 'ratio'
        ? (s.result?.ratio ?? null)
        : s.station;
  const dir = sort.direction === 'desc' ? -1 : 1;
  return rows.sort((a, b) => {
    const va = value(a);
    const vb = value(b);
    if (va === null && vb === null) return a.id - b.id;
    if (va === null) return 1; // nulls last either way, as the server has them
    if (vb === null) return -1;
    return (va - vb) * dir || a.id - b.id;
  });
}

/** The table's columns for a batch of one case, and the ones a batch of several adds. */
const ONE_CASE_COLUMNS = [
  'station',
  'section',
  'method',
  'fs',
  'required',
  'verdict',
  'warnings',
  'review',
  'status',
];
const CASES_COLUMNS = [
  'expand',
  'station',
  'section',
  'case',
  'method',
  'fs',
  'required',
  'ratio',
  'verdict',
  'warnings',
  'review',
  'status',
];

/**
 * The sections of a batch as a Material table: sorted, filtered and paged by the server; a
 * text filter (station or section) searches every section of the batch here instead. In a
 * batch of several design cases each row shows its governing case and opens to every case,
 * and the verdict filter can be that of one case.
 */
@Component({
  selector: 'sl-section-table',
  imports: [
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './section-table.html',
  styleUrl: './section-table.scss',
})
export class SectionTable {
  private readonly api = inject(BatchesApi);

  readonly batchId = input.required<number>();
  /** Bumped by the page when the results change: the table reads its page again. */
  readonly version = input(0);
  /** Every section of the batch (for the text filter); null while loading. */
  readonly all = input<readonly SectionListItem[] | null>(null);

  /** The design cases of the batch when there are several; empty: shown as one case. */
  readonly cases = input<readonly BatchCase[]>([]);

  protected readonly manyCases = computed(() => this.cases().length > 1);
  /** Whether any station carries a probability of failure: its columns are shown then. */
  protected readonly withProbability = computed(() =>
    [...(this.all() ?? []), ...this.view().rows].some((s) => (s.probability?.length ?? 0) > 0),
  );
  protected readonly columns = computed(() => {
    const base = this.manyCases() ? CASES_COLUMNS : ONE_CASE_COLUMNS;
    if (!this.withProbability()) return base;
    const at = base.indexOf('verdict') + 1;
    return [...base.slice(0, at), 'pf', 'beta', ...base.slice(at)];
  });
  protected readonly statuses: readonly SectionStatus[] = JOB_STATES;
  protected jobWord(state: SectionStatus): string {
    return JOB_STATE_WORDS[state];
  }
  /** The verdicts the filter offers, in the core's words. */
  protected readonly verdictChoices = computed(() => {
    const all = this.all() ?? [];
    const flat = all.some(
      (s) =>
        s.result?.verdict === 'no-slope' ||
        (s.result?.cases ?? []).some((c) => c.verdict === 'no-slope'),
    );
    const codes: Exclude<VerdictFilter, 'all'>[] = flat
      ? ['meets', 'below', 'no-slope']
      : ['meets', 'below'];
    return codes.map((v) => ({ value: v, label: capitalised(verdictView(v).short) }));
  });
  protected readonly pageSizes = [25, 50, 100, 200];

  protected readonly sort = signal<{ active: SectionSort; direction: 'asc' | 'desc' }>({
    active: 'station',
    direction: 'asc',
  });
  protected readonly page = signal({ index: 0, size: 50 });
  protected readonly verdictFilter = signal<VerdictFilter>('all');
  protected readonly status = signal<SectionStatus | ''>('');
  protected readonly text = signal('');
  /** Whose verdict the filter asks for: a case's, or the station's (null). */
  protected readonly caseFilter = signal<string | null>(null);
  /** The rows opened to show every case (by section id). */
  protected readonly expanded = signal<ReadonlySet<number>>(new Set());
  private readonly retryTick = signal(0);

  /** The server's query, or null while the text filter works over every section here. */
  private readonly query = computed(() => {
    if (this.text().trim()) return null;
    const q: SectionQuery = {
      sort: this.sort().active,
      order: this.sort().direction,
      page: this.page().index + 1,
      pageSize: this.page().size,
    };
    if (this.status()) q.status = this.status() as SectionStatus;
    const verdict = this.verdictFilter();
    if (verdict !== 'all') {
      q.verdict = verdict;
      const c = this.caseFilter();
      if (c !== null && this.manyCases()) q.case = c;
    }
    return { batchId: this.batchId(), q, version: this.version(), retry: this.retryTick() };
  });

  private readonly server = toSignal(
    toObservable(this.query).pipe(
      switchMap((x) => (x === null ? EMPTY : loadState(this.api.sections(x.batchId, x.q)))),
      keepLast<SectionPage>(),
    ),
    { initialValue: nothingYet<SectionPage>() },
  );

  private readonly local = computed(() => {
    const all = this.all();
    if (!this.text().trim()) return null;
    if (all === null) return { loading: true, rows: [], total: 0 };
    const rows = filterSections(
      all,
      {
        text: this.text(),
        verdict: this.verdictFilter(),
        status: this.status(),
        caseName: this.manyCases() ? this.caseFilter() : null,
      },
      this.sort(),
    );
    const { index, size } = this.page();
    return {
      loading: false,
      rows: rows.slice(index * size, index * size + size),
      total: rows.length,
    };
  });

  protected readonly view = computed(() => {
    const local = this.local();
    if (local) return { ...local, problem: null as Problem | null };
    const s = this.server();
    return {
      loading: s.loading,
      rows: s.value?.items ?? [],
      total: s.value?.total ?? 0,
      problem: s.problem,
    };
  });

  protected readonly fs = formatFs;
  protected readonly probabilityText = probabilityText;
  protected readonly betaText = betaText;
  /** The station's case of the greatest P(FS < 1), shown in its row. */
  protected readonly worst = (s: SectionListItem) => worstCase(s.probability);
  /** A case's probability summary, in the station's opened case rows. */
  protected probabilityOf(s: SectionListItem, caseName: string): ProbabilitySummary | null {
    return s.probability?.find((p) => p.case === caseName) ?? null;
  }
  protected readonly ratio = formatRatio;
  protected readonly kindWords = caseKindWords;
  protected readonly method = methodName;
  protected readonly verdictOf = verdictOfItem;
  protected readonly shown = verdictView;

  protected onSort(e: Sort): void {
    const active = e.active === 'fs' || e.active === 'ratio' ? e.active : 'station';
    this.sort.set({ active, direction: e.direction === 'desc' ? 'desc' : 'asc' });
    this.page.update((p) => ({ ...p, index: 0 }));
  }

  protected onPage(e: PageEvent): void {
    this.page.set({ index: e.pageIndex, size: e.pageSize });
  }

  protected setVerdict(v: VerdictFilter): void {
    this.verdictFilter.set(v);
    this.page.update((p) => ({ ...p, index: 0 }));
  }

  protected setCase(name: string | null): void {
    this.caseFilter.set(name);
    if (this.verdictFilter() !== 'all') this.page.update((p) => ({ ...p, index: 0 }));
  }

  protected isOpen(id: number): boolean {
    return this.expanded().has(id);
  }

  protected toggle(id: number): void {
    this.expanded.update((open) => {
      const next = new Set(open);
      if (!next.delete(id)) next.add(id);
      return next;
    });
  }

  /**
   * A governing FS as the table writes it: none where the verdict says there is no
   * significant slope (a large FS there means nothing; the verdict says why).
   */
  protected fsOf(r: Pick<SectionListCase, 'verdict' | 'governingFs'> | null | undefined): string {
    return r?.verdict === 'no-slope' ? '—' : formatFs(r?.governingFs);
  }

  /** Every case of a listed section, the governing one marked. */
  protected casesOf(s: SectionListItem): (SectionListCase & { governing: boolean })[] {
    const r = s.result;
    return (r?.cases ?? []).map((c) => ({ ...c, governing: c.name === r?.governingCase }));
  }

  protected setStatus(v: SectionStatus | ''): void {
    this.status.set(v);
    this.page.update((p) => ({ ...p, index: 0 }));
  }

  protected setText(v: string): void {
    this.text.set(v);
    this.page.update((p) => ({ ...p, index: 0 }));
  }

  protected retry(): void {
    this.retryTick.update((n) => n + 1);
  }

  /** The station as the API writes it, or as chainage in the section's own units. */
  protected stationText(s: SectionListItem): string {
    if (s.stationLabel) return s.stationLabel;
    return s.station === null ? '—' : formatChainage(s.station, s.units);
  }

  protected warningCount(s: SectionListItem): string {
    const w = s.result?.warnings;
    return w === undefined ? '—' : String(w.length);
  }

  protected warningTitle(s: SectionListItem): string | null {
    const w = s.result?.warnings;
    return w && w.length > 0 ? w.map((x) => x.message).join('\n') : null;
  }
}
