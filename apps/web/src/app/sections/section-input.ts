import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { fromSi, type QuantityKind } from '@scarpline/core/units';
import { plain, pointText, unitOf } from './format';
import { methodName } from '../shared/method-names';
import { caseKindWords } from '../shared/case-kinds';
import type { Load, Material, SectionInput } from './section-types';

/**
 * The section as it was analysed: materials, water, loads and the analysis settings in the
 * section's units, and the whole stored input (normalised, SI) to read or copy.
 */
@Component({
  selector: 'sl-section-input',
  imports: [MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @let s = section();
    <h3>Materials</h3>
    <div class="scroll" tabindex="0" role="region" aria-label="Materials, scrolls sideways">
      <table class="materials" data-testid="material-table">
        <thead>
          <tr>
            <th scope="col">Name</th>
            <th scope="col">Strength model</th>
            <th scope="col" class="sl-num">
              γ<span class="u">{{ u('unitWeight') }}</span>
            </th>
            <th scope="col" class="sl-num">
              γsat<span class="u">{{ u('unitWeight') }}</span>
            </th>
            <th scope="col">Strength parameters</th>
          </tr>
        </thead>
        <tbody>
          @for (m of materials(); track m.name) {
            <tr>
              <th scope="row">{{ m.name }}</th>
              <td>{{ m.model }}</td>
              <td class="sl-num">{{ m.unitWeight }}</td>
              <td class="sl-num">{{ m.saturatedUnitWeight }}</td>
              <td>{{ m.strength }}</td>
            </tr>
          }
        </tbody>
      </table>
    </div>

    <h3>Water</h3>
    @switch (s.water.kind) {
      @case ('none') {
        <p>Dry: no pore pressure. γw {{ v(s.water.unitWeight, 'unitWeight') }}.</p>
      }
      @case ('ru') {
        <p>
          Pore-pressure ratio ru = {{ ru() }} (u = ru·σv); γw
          {{ v(s.water.unitWeight, 'unitWeight') }}.
        </p>
      }
      @case ('piezometric') {
        <p>
          Piezometric line of {{ line().length }} points from {{ line()[0] }} to
          {{ line()[line().length - 1] }} {{ u('length') }}; γw
          {{ v(s.water.unitWeight, 'unitWeight') }}. Above the ground the water is ponded.
        </p>
        <details>
          <summary>The points of the line</summary>
          <ol class="points">
            @for (p of line(); track $index) {
              <li>{{ p }}</li>
            }
          </ol>
        </details>
      }
    }

    <h3>Loads</h3>
    @if (loads().length === 0) {
      <p>No loads.</p>
    } @else {
      <ul class="loads">
        @for (l of loads(); track $index) {
          <li>{{ l }}</li>
        }
      </ul>
    }

    <h3>Analysis</h3>
    <dl class="settings">
      @for (row of settings(); track row[0]) {
        <div>
          <dt>{{ row[0] }}</dt>
          <dd>{{ row[1] }}</dd>
        </div>
      }
    </dl>

    @if (cases().length > 0) {
      <h3>Design cases</h3>
      <p class="hint">
        Each case starts from the settings above and replaces what it gives (water, loads, the
        seismic coefficient, materials by name, analysis settings).
      </p>
      <ul class="cases" data-testid="input-cases">
        @for (c of cases(); track c.name) {
          <li>
            <strong>{{ c.name }}</strong> ({{ c.kind }}): {{ c.facts }}
          </li>
        }
      </ul>
    }

    <details class="whole">
      <summary>The whole input as stored (JSON, SI units)</summary>
      <div class="json-tools">
        <span class="hint">
          Normalised by the solver: SI units (m, kN, kPa, kN/m³), every default filled in.
        </span>
        <button mat-stroked-button type="button" (click)="copy()">
          <mat-icon aria-hidden="true">content_copy</mat-icon>
          Copy
        </button>
      </div>
      <pre tabindex="0" aria-label="The whole input as JSON">{{ json() }}</pre>
    </details>
  `,
  styles: `
    h3 {
      font-size: 15px;
      margin: 16px 0 6px;
    }
    h3:first-of-type {
      margin-top: 0;
    }
    p {
      margin: 4px 0;
    }
    .scroll {
      overflow-x: auto;
    }
    table {
      border-collapse: collapse;
      width: 100%;
      min-width: 560px;
      font-size: 14px;
    }
    th,
    td {
      padding: 6px 8px;
      border-bottom: 1px solid var(--sl-line);
      text-align: left;
      vertical-align: bottom;
    }
    thead th {
      color: var(--sl-muted);
      font-weight: 600;
      font-size: 13px;
    }
    tbody th {
      font-weight: 500;
    }
    .sl-num {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
    .u {
      display: block;
      font-weight: 400;
    }
    .points {
      columns: 3 160px;
      font-variant-numeric: tabular-nums;
      font-size: 13px;
    }
    .loads,
    .cases {
      margin: 4px 0;
      padding-left: 20px;
    }
    .settings {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(220px, 1fr));
      gap: 6px 16px;
      margin: 0;
    }
    dt {
      color: var(--sl-muted);
      font-size: 13px;
    }
    dd {
      margin: 0;
    }
    summary {
      cursor: pointer;
      padding: 4px 0;
    }
    .whole {
      margin-top: 16px;
    }
    .json-tools {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      align-items: center;
      justify-content: space-between;
      margin: 4px 0 8px;
    }
    .hint {
      color: var(--sl-muted);
      font-size: 13px;
    }
    pre {
      max-height: 360px;
      overflow: auto;
      background: var(--sl-paper);
      border: 1px solid var(--sl-line);
      border-radius: 6px;
      padding: 10px;
      font-size: 12.5px;
      margin: 0;
    }
  `,
})
export class SectionInputView {
  private readonly clipboard = inject(Clipboard);
  private readonly snack = inject(MatSnackBar);

  readonly section = input.required<SectionInput>();

  protected readonly units = computed(() => this.section().units ?? 'si');
  protected readonly json = computed(() => JSON.stringify(this.section(), null, 2));

  protected u(q: QuantityKind): string {
    return unitOf(this.units(), q);
  }

  /** A stored SI value in the section's units, with its unit. */
  protected v(value: number, q: QuantityKind): string {
    return `${plain(fromSi(value, q, this.units()), 3)} ${this.u(q)}`;
  }

  private n(value: number, q: QuantityKind): string {
    return plain(fromSi(value, q, this.units()), 3);
  }

  protected readonly materials = computed(() =>
    Object.values(this.section().materials).map((m: Material) => {
      const rigid = m.strength.model === 'rigid';
      return {
        name: m.name,
        model: m.strength.model,
        unitWeight: rigid && m.unitWeight === 0 ? '—' : this.n(m.unitWeight, 'unitWeight'),
        saturatedUnitWeight:
          rigid && m.saturatedUnitWeight === 0 ? '—' : this.n(m.saturatedUnitWeight, 'unitWeight'),
        strength: this.strengthText(m),
      };
    }),
  );

  private strengthText(m: Material): string {
    const s = m.strength;
    switch (s.model) {
      case 'mohr-coulomb':
        return `c′ ${this.v(s.cohesion, 'pressure')}, φ′ ${plain(s.frictionAngle, 2)}°`;
      case 'undrained': {
        const base = `Su ${this.v(s.su, 'pressure')}`;
        return s.suRate > 0
          ? `${base} at y = ${this.v(s.suDatum ?? 0, 'length')}, + ${this.v(s.suRate, 'pressurePerLength')} below`
          : `${base}, constant`;
      }
      case 'rigid':
        return 'rigid base: no slip surface enters it';
      case 'hoek-brown':
        return `Hoek–Brown σci ${this.v(s.intactStrength, 'pressure')}, GSI ${plain(s.gsi, 2)}, mi ${plain(s.mi, 2)}, D ${plain(s.disturbance, 2)}`;
      case 'undrained-ratio':
        return `Su = ${plain(s.ratio, 3)} σ′v · ${s.pop !== null ? `OCR^${plain(s.exponent, 2)}, POP ${this.v(s.pop, 'pressure')}` : `${plain(s.ocr, 2)}^${plain(s.exponent, 2)}`}, at least ${this.v(s.minimum, 'pressure')}`;
      case 'shear-normal':
        return `τ at σ′n: ${s.points.map((p) => `(${this.n(p[0], 'pressure')}, ${this.n(p[1], 'pressure')})`).join(' ')} ${this.u('pressure')}`;
      case 'bilinear':
        return `c′ ${this.v(s.cohesion, 'pressure')}, φ′ ${plain(s.frictionAngle, 2)}° up to σ′n ${this.v(s.breakStress, 'pressure')}, ${plain(s.frictionAngleBeyond, 2)}° beyond`;
    }
  }

  protected readonly ru = computed(() => {
    const w = this.section().water;
    return w.kind === 'ru' ? plain(w.ru, 3) : '';
  });

  protected readonly line = computed(() => {
    const w = this.section().water;
    if (w.kind !== 'piezometric') return [] as string[];
    const L = (x: number) => fromSi(x, 'length', this.units());
    return w.line.map((p) => pointText([L(p[0]), L(p[1])]));
  });

  protected readonly loads = computed(() =>
    this.section().loads.map((l: Load) =>
      l.type === 'strip'
        ? `Strip load ${this.v(l.pressure, 'pressure')} from x = ${this.n(l.from, 'length')} to ${this.v(l.to, 'length')}`
        : `Line load ${this.v(l.force, 'forcePerLength')} at x = ${this.v(l.x, 'length')}, ${plain(l.angle, 1)}° from the downward vertical`,
    ),
  );

  /** The design cases of the input, each in a line: kind, requirement, what governs, kh. */
  protected readonly cases = computed(() =>
    (this.section().cases ?? []).map((c) => {
      const facts = [
        c.requiredFs === null ? 'no required FS' : `required FS ${plain(c.requiredFs)}`,
        c.governs === null
          ? 'every method governs'
          : `governed by ${c.governs.map(methodName).join(', ')}`,
      ];
      if (c.seismic.kh > 0) facts.push(`kh ${plain(c.seismic.kh)}`);
      if (c.drawdown) {
        const slow = Object.values(c.drawdown.materials).filter((m) => m.drains === 'slow');
        facts.push(
          `rapid drawdown, ${slow.length} ${slow.length === 1 ? 'material drains' : 'materials drain'} slowly`,
        );
      }
      if (c.earthquake?.pga != null) facts.push(`design PGA ${plain(c.earthquake.pga)} g`);
      return { name: c.name, kind: caseKindWords(c.kind), facts: facts.join('; ') };
    }),
  );

  protected readonly settings = computed((): [string, string][] => {
    const s = this.section();
    const a = s.analysis;
    const rows: [string, string][] = [
      ['Units of the file', s.units === 'us' ? 'US customary (ft, lbf, psf, pcf)' : 'SI'],
      ['Design case', a.case ?? '—'],
      ['Required FS', a.requiredFs === null ? 'none' : plain(a.requiredFs)],
      ['Methods', a.methods.map(methodName).join(', ')],
      ['Slices', String(a.slices)],
      ['Slip surface', this.surfaceSpec()],
    ];
    if (a.interslice) {
      const fn = a.interslice;
      const text =
        fn.shape === 'piecewise-linear'
          ? `piecewise-linear through [ξ, f] ${fn.points.map(([x, f]) => `[${plain(x, 3)}, ${plain(f, 3)}]`).join(' ')}`
          : fn.shape;
      rows.push(['Interslice function f(ξ)', text]);
    }
    if (a.trialBand !== undefined)
      rows.push([
        'Trial surfaces drawn',
        `within ${plain(a.trialBand * 100, 2)} % of the least FS`,
      ]);
    if (a.searchEachMethod) rows.push(['Search', 'critical circle polished for each method']);
    if (a.infiniteSlope) {
      const i = a.infiniteSlope;
      rows.push([
        'Infinite slope',
        `β ${plain(i.angle, 2)}°, depth ${this.v(i.depth, 'length')}, m = ${plain(i.waterRatio, 3)}`,
      ]);
    }
    rows.push([
      'Seismic',
      s.seismic.kh || s.seismic.kv
        ? `kh ${plain(s.seismic.kh, 3)}, kv ${plain(s.seismic.kv, 3)}`
        : 'none',
    ]);
    rows.push([
      'Tension crack',
      s.crack === null
        ? 'none'
        : `${s.crack.depth === 'auto' ? 'Rankine depth' : this.v(s.crack.depth, 'length')} deep, ${this.v(s.crack.waterDepth, 'length')} of water`,
    ]);
    if (s.station !== null) rows.push(['Station', plain(s.station, 3)]);
    return rows;
  });

  private surfaceSpec(): string {
    const sf = this.section().analysis.surface;
    if (!sf) return 'none given';
    if (sf.type === 'circle') {
      const [cx, cy] = sf.center;
      const L = (x: number) => fromSi(x, 'length', this.units());
      return `given circle: centre ${pointText([L(cx), L(cy)])}, radius ${this.v(sf.radius, 'length')}`;
    }
    if (sf.type === 'polyline') {
      return `given polyline of ${sf.points.length} points`;
    }
    const words: Record<string, string> = {
      grid: 'search: grid of circle centres',
      'ground-ranges': 'search: circles through ground ranges',
      noncircular: 'search: noncircular',
      auto: sf['noncircular'] ? 'search: automatic, refined noncircular' : 'search: automatic',
    };
    return words[sf.type] ?? sf.type;
  }

  protected copy(): void {
    const ok = this.clipboard.copy(this.json());
    this.snack.open(ok ? 'Input copied.' : 'Could not copy; select the text instead.', 'OK', {
      duration: 3000,
    });
  }
}
