import { TestBed } from '@angular/core/testing';
import { DrawdownReportView } from './drawdown-report';
import { SeismicReportView } from './seismic-report';
import { DRAWDOWN, EARTHQUAKE } from '../testing/section-case-fixtures';
import type { SeismicReport } from './section-types';

const words = (el: Element | null | undefined) => el?.textContent?.replace(/\s+/g, ' ').trim();

describe('DrawdownReportView', () => {
  async function render(report = DRAWDOWN.drawdown!) {
    const f = TestBed.createComponent(DrawdownReportView);
    f.componentRef.setInput('report', report);
    await f.whenStable();
    return f.nativeElement as HTMLElement;
  }

  it('gives the F of each of the three stages with what the stage does, in plain words', async () => {
    const el = await render();
    const stages = Array.from(el.querySelectorAll('[data-testid=drawdown-stages] li')).map(words);
    expect(stages).toEqual([
      'Stage 1, before drawdown: effective stresses with the water before drawdown; they give the consolidation stresses on each slice base. F = 1.913',
      'Stage 2, undrained: soils that drain slowly take the undrained strength their consolidation stresses give; the water after drawdown acts on the slope. F = 1.187',
      'Stage 3, drained where weaker: where a slice’s drained strength, with the pore pressures after drawdown, is lower than its undrained strength, the drained strength is used. F = 1.104',
    ]);
    expect(words(el.querySelector('[data-testid=drawdown-drained]'))).toBe(
      'For comparison, the fully drained drawdown (drained strengths in every soil with the pore pressures after drawdown): F = 1.062, 0.042 below the three-stage F.',
    );
    expect(words(el.querySelector('[data-testid=drawdown-slices]'))).toBe(
      "On the critical surface, 1 of 3 slices undrained (stage 2), 1 of 3 slices drained, lower than undrained (stage 3), 1 of 3 slices drained (drains freely). The slice table gives each slice's strength and the stage that set it (strengths in kPa).",
    );
  });

  it('says when the three-stage F equals the drained drawdown (no slice weaker undrained), and a stage without F', async () => {
    const el = await render({
      stages: [
        { stage: 1, fs: 1.9 },
        { stage: 2, fs: 1.3 },
        { stage: 3, fs: null },
      ],
      drainedFs: 1.3,
      slices: [],
    });
    expect(words(el.querySelectorAll('[data-testid=drawdown-stages] li')[2])).toContain('F = —');
    expect(words(el.querySelector('[data-testid=drawdown-drained]'))).toContain(
      'F = 1.300, the same as the three-stage F.',
    );
    expect(el.querySelector('[data-testid=drawdown-slices]')).toBeNull();
  });
});

describe('SeismicReportView', () => {
  async function render(report: SeismicReport = EARTHQUAKE.seismic!, units: 'si' | 'us' = 'si') {
    const f = TestBed.createComponent(SeismicReportView);
    f.componentRef.setInput('report', report);
    f.componentRef.setInput('units', units);
    f.componentRef.setInput('kh', 0.1);
    await f.whenStable();
    return f.nativeElement as HTMLElement;
  }

  it('explains ky, the ground motion and each estimate against the allowable, in and out of range', async () => {
    const el = await render();
    expect(words(el.querySelector('p'))).toBe(
      'The factors of safety above are pseudo-static, with the horizontal seismic coefficient kh = 0.1.',
    );
    expect(words(el.querySelector('[data-testid=yield-coefficient]'))).toBe(
      'Yield coefficient ky = 0.183: the horizontal seismic coefficient at which the least factor of safety of the search falls to 1.0 (7 searches). Shaking stronger than ky·g moves the sliding mass; weaker shaking does not.',
    );
    expect(words(el.querySelector('[data-testid=ground-motion]'))).toBe(
      'Design peak ground acceleration 0.25 g, magnitude 6.5; ky / PGA = 0.73, the ratio the relations below take.',
    );
    const rows = Array.from(el.querySelectorAll('[data-testid=displacement-table] tbody tr')).map(
      (r) => Array.from(r.children).map(words),
    );
    expect(rows).toEqual([
      ['Jibson (2007)', '12.4', '40.1', '150.0', 'yes'],
      [
        'Ambraseys & Menu (1988)',
        '16.8',
        '41.0',
        '150.0',
        'no: outside the data it was fitted to magnitude outside the data of the relation',
      ],
    ]);
    expect(words(el.querySelector('caption'))).toContain('(mm)');
    expect(words(el.querySelector('[data-testid=displacement-verdict]'))).toBe(
      'The larger median, 16.8 mm (Ambraseys & Menu (1988)), is within the allowable 150.0 mm.',
    );
  });

  it('says when the estimate exceeds the allowable (in inches for a us file), and when there is no ky', async () => {
    let el = await render({ ...EARTHQUAKE.seismic!, allowable: 0.5, within: false }, 'us');
    const verdict = el.querySelector('[data-testid=displacement-verdict]');
    expect(words(verdict)).toBe(
      'The larger median, 16.80 in (Ambraseys & Menu (1988)), exceeds the allowable 0.50 in.',
    );
    expect(verdict?.classList).toContain('sl-fail');
    el = await render({ ...EARTHQUAKE.seismic!, ky: null, displacements: [], within: null });
    expect(words(el.querySelector('[data-testid=yield-coefficient]'))).toContain(
      'No yield coefficient: no horizontal seismic coefficient in the range searched brings the least factor of safety down to 1.0',
    );
    expect(el.querySelector('[data-testid=displacement-table]')).toBeNull();
  });
});
