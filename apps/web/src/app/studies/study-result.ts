import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import { drawProbability, drawSensitivity, drawTornado } from '@scarpline/core/draw';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Caution } from '../shared/caution';
import { saveFile } from '../shared/download';
import { fsText, plain } from '../sections/format';
import { methodName } from '../shared/method-names';
import { betaText, pText } from './probability-format';
import type { Study } from './study-types';

/**
 * A done study's result: for a probabilistic analysis each case's mean and SD of FS, P(FS < 1)
 * and P(FS < required) with their standard errors and β, the Taylor series check beside it and
 * the distribution drawn; for a sensitivity the FS range of each variable and its drawings; for
 * a solve the value found, its FS and the analyses, or why none was. The caution with each.
 */
@Component({
  selector: 'sl-study-result',
  imports: [Caution, MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './study-result.html',
  styleUrl: './study-result.scss',
})
export class StudyResult {
  private readonly sanitizer = inject(DomSanitizer);

  readonly study = input.required<Study>();

  protected readonly fsText = fsText;
  protected readonly pText = pText;
  protected readonly betaText = betaText;
  protected readonly plain = plain;
  protected readonly methodName = methodName;

  protected readonly probability = computed(() => {
    const r = this.study().result;
    return r?.kind === 'probability' ? r : null;
  });
  protected readonly sensitivity = computed(() => {
    const r = this.study().result;
    return r?.kind === 'sensitivity' ? r.sensitivity : null;
  });
  protected readonly solve = computed(() => {
    const r = this.study().result;
    return r?.kind === 'solve' ? r.solve : null;
  });

  /** The cases of the result, for the drawing's choice. */
  protected readonly caseNames = computed(() => {
    const p = this.probability();
    if (p) return p.probability.cases.map((c) => c.case);
    return this.sensitivity()?.cases.map((c) => c.case) ?? [];
  });
  protected readonly picked = signal<string | null>(null);
  protected readonly drawnCase = computed(() => {
    const names = this.caseNames();
    const p = this.picked();
    return p !== null && names.includes(p) ? p : (names[0] ?? null);
  });

  /** The Taylor series check of a case, beside its counted numbers. */
  protected taylorOf(name: string) {
    return this.probability()?.taylor.cases.find((c) => c.case === name) ?? null;
  }

  /** The core's drawings of the drawn case (histogram and CDF; or tornado and one at a time). */
  protected readonly drawings = computed(
    (): { label: string; file: string; text: string; html: SafeHtml }[] => {
      const name = this.drawnCase();
      const title = this.study().result === null ? '' : this.titleOf();
      const safe = (t: string) => t.replace(/[^A-Za-z0-9._-]+/g, '_');
      const drawing = (label: string, what: string, text: string) => ({
        label,
        file: `study-${this.study().id}-${what}-${safe(name ?? '')}.svg`,
        text,
        html: this.sanitizer.bypassSecurityTrustHtml(text),
      });
      const p = this.probability();
      if (p) {
        const c = p.probability.cases.find((x) => x.case === name);
        if (!c) return [];
        return [
          drawing(
            `Distribution of FS of the case ${c.case}: histogram and cumulative distribution`,
            'distribution',
            drawProbability(c, { title: `${title} · ${c.case}` }),
          ),
        ];
      }
      const s = this.sensitivity();
      if (s) {
        const c = s.cases.find((x) => x.case === name);
        if (!c || c.series.length === 0) return [];
        return [
          drawing(
            `Range of FS by variable, case ${c.case}`,
            'tornado',
            drawTornado(c, { title: `${title} · ${c.case}` }),
          ),
          drawing(
            `FS as each variable moves through its range, case ${c.case}`,
            'one-at-a-time',
            drawSensitivity(c, { title: `${title} · ${c.case}` }),
          ),
        ];
      }
      return [];
    },
  );

  /** Saves a drawing as the SVG file it is. */
  protected save(d: { file: string; text: string }): void {
    saveFile(new Blob([d.text], { type: 'image/svg+xml' }), d.file);
  }

  private titleOf(): string {
    const r = this.study().result;
    if (!r) return '';
    switch (r.kind) {
      case 'probability':
        return r.probability.title;
      case 'sensitivity':
        return r.sensitivity.title;
      case 'solve':
        return r.solve.title;
    }
  }
}
