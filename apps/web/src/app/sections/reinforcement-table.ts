import { ChangeDetectionStrategy, Component, computed, input, linkedSignal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { limitWords } from '@scarpline/core/result';
import { fixed, pointText, unitOf } from './format';
import { methodName } from '../shared/method-names';
import type { MethodId, MethodReport, ReinforcementReport, UnitSystem } from './section-types';

/** A kind of reinforcing element, in words. */
export const REINFORCEMENT_KIND_WORDS: Readonly<Record<ReinforcementReport['type'], string>> = {
  geosynthetic: 'geosynthetic layer',
  nail: 'soil nail',
  anchor: 'ground anchor',
  pile: 'pile or shear key',
};

/** One row: an element's crossing with the surface, or the element not crossed. */
export interface ReinforcementRow {
  name: string;
  kind: string;
  /** First row of its element (the name is shown once). */
  first: boolean;
  crossed: boolean;
  at: string;
  slice: number | null;
  force: string;
  available: string;
  limit: string;
  dividedByF: string;
  counted: boolean;
}

/**
 * The reinforcement of one method (the governing one unless another is picked): each element
 * where the method's slip surface crosses it, the slice it acts on, the force in the
 * equilibrium and the force available there (per unit run, in the section's units), what limits
 * it, and whether the method divides it by F; an element the surface does not cross is listed
 * as not crossed.
 */
@Component({
  selector: 'sl-reinforcement-table',
  imports: [MatFormFieldModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="head">
      <p class="note" data-testid="reinforcement-note">
        @if (shown(); as r) {
          Reinforcement on the slip surface of <strong>{{ name(r.method) }}</strong>
          @if (r.method === governing()) {
            (governing)
          }
          · forces per {{ u().length }} run
        }
      </p>
      @if (withReinforcement().length > 1) {
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="pick">
          <mat-label>Method</mat-label>
          <mat-select [value]="picked()" (valueChange)="picked.set($event)">
            @for (m of withReinforcement(); track m.method) {
              <mat-option [value]="m.method">{{ name(m.method) }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
      }
    </div>
    <div class="scroll" tabindex="0" role="region" aria-label="Reinforcement, scrolls sideways">
      <table data-testid="reinforcement-table">
        <thead>
          <tr>
            <th scope="col">Element</th>
            <th scope="col">Kind</th>
            <th scope="col">
              Where crossed<span class="u">(x, y) {{ u().length }}</span>
            </th>
            <th scope="col" class="sl-num">Slice</th>
            <th scope="col" class="sl-num">
              Force in the equilibrium<span class="u">{{ u().force }}</span>
            </th>
            <th scope="col" class="sl-num">
              Available<span class="u">{{ u().force }}</span>
            </th>
            <th scope="col">What limits it</th>
            <th scope="col">Divided by F</th>
          </tr>
        </thead>
        <tbody>
          @for (row of rows(); track $index) {
            <tr [class.idle]="!row.crossed || !row.counted">
              @if (row.first) {
                <th scope="row">{{ row.name }}</th>
              } @else {
                <td class="same" [attr.aria-label]="row.name"></td>
              }
              <td>{{ row.kind }}</td>
              <td>{{ row.at }}</td>
              <td class="sl-num">{{ row.slice ?? '—' }}</td>
              <td class="sl-num force">{{ row.force }}</td>
              <td class="sl-num">{{ row.available }}</td>
              <td>{{ row.limit }}</td>
              <td>{{ row.dividedByF }}</td>
            </tr>
          }
        </tbody>
      </table>
    </div>
    <p class="legend">
      Available: the least of the element's capacities where the surface crosses it (its strength,
      its pullout behind the surface, its pullout or facing in front). Force in the equilibrium: the
      available force divided by the method's F where the element is divided by F, else the
      available force itself. A tension element the movement would push carries nothing there.
    </p>
  `,
  styles: `
    .head {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      justify-content: space-between;
      gap: 8px 16px;
      margin-bottom: 8px;
    }
    .note {
      margin: 0;
    }
    .pick {
      width: 240px;
    }
    .scroll {
      overflow-x: auto;
    }
    table {
      border-collapse: collapse;
      width: 100%;
      min-width: 820px;
      font-size: 14px;
    }
    th,
    td {
      padding: 6px 10px;
      border-bottom: 1px solid var(--sl-line);
      text-align: left;
      vertical-align: top;
    }
    thead th {
      font-weight: 600;
      color: var(--sl-muted);
      font-size: 13px;
      vertical-align: bottom;
    }
    tbody th {
      font-weight: 500;
    }
    .u {
      display: block;
      font-weight: 400;
    }
    .sl-num {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
    .force {
      font-weight: 600;
    }
    tr.idle td {
      color: var(--sl-ink-soft);
    }
    .legend {
      font-size: 12.5px;
      color: var(--sl-muted);
      margin: 8px 0 0;
      line-height: 1.4;
    }
  `,
})
export class ReinforcementTable {
  readonly methods = input.required<readonly MethodReport[]>();
  /** The governing method: shown first. */
  readonly governing = input<MethodId | null>(null);
  readonly units = input<UnitSystem>('si');

  protected readonly name = methodName;
  protected readonly withReinforcement = computed(() =>
    this.methods().filter((m) => (m.reinforcement?.length ?? 0) > 0),
  );
  protected readonly picked = linkedSignal<MethodId | null>(() => {
    const list = this.withReinforcement();
    const gov = this.governing();
    return list.find((m) => m.method === gov)?.method ?? list[0]?.method ?? null;
  });
  protected readonly shown = computed(
    () => this.withReinforcement().find((m) => m.method === this.picked()) ?? null,
  );
  protected readonly u = computed(() => ({
    length: unitOf(this.units(), 'length'),
    force: unitOf(this.units(), 'forcePerLength'),
  }));
  protected readonly rows = computed<ReinforcementRow[]>(() =>
    (this.shown()?.reinforcement ?? []).flatMap((e) => reinforcementRows(e)),
  );
}

/** The rows of one element: one a crossing, or one saying it is not crossed. */
export function reinforcementRows(e: ReinforcementReport): ReinforcementRow[] {
  const kind = REINFORCEMENT_KIND_WORDS[e.type] ?? e.type;
  const divided = e.dividedByF ? 'yes' : 'no (full value)';
  if (e.crossings.length === 0) {
    return [
      {
        name: e.name,
        kind,
        first: true,
        crossed: false,
        at: 'not crossed',
        slice: null,
        force: fixed(0, 1),
        available: '—',
        limit: '—',
        dividedByF: divided,
        counted: false,
      },
    ];
  }
  return e.crossings.map((c, i) => ({
    name: e.name,
    kind,
    first: i === 0,
    crossed: true,
    at: pointText(c.at),
    slice: c.slice,
    force: fixed(c.force, 1),
    available: fixed(c.available, 1),
    limit: c.counted ? limitWords(c.mode, e.type) : 'pushed, not pulled: carries nothing',
    dividedByF: divided,
    counted: c.counted,
  }));
}
