import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { CHAINAGE_STYLE } from '@scarpline/core/draw';
import { ChainageFrame, type ChainageFrameLayout } from './chainage-frame';
import type { Units } from './scales';

const SVG = 'http://www.w3.org/2000/svg';

/** A frame 400 × 200 with its plot from (50, 10) to (380, 160): two y ticks, three x ticks. */
const FRAME: ChainageFrameLayout = {
  width: 400,
  height: 200,
  plot: { left: 50, right: 380, top: 10, bottom: 160 },
  yTicks: [
    { value: 0, y: 160, text: '0' },
    { value: 2, y: 10, text: '2' },
  ],
  xTicks: [
    { value: 1000, x: 60, text: '1+000' },
    { value: 1050, x: 215, text: '1+050' },
    { value: 1100, x: 370, text: '1+100' },
  ],
};

@Component({
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChainageFrame],
  template: `<svg width="400" height="200">
    <g slChainageFrame [frame]="frame()" [units]="units()" [yTitle]="yTitle()"></g>
  </svg>`,
})
class Host {
  readonly frame = signal(FRAME);
  readonly units = signal<Units | null>('si');
  readonly yTitle = signal('Factor of safety');
}

async function render() {
  const fixture = TestBed.createComponent(Host);
  await fixture.whenStable();
  return { fixture, el: fixture.nativeElement as HTMLElement };
}

const num = (e: Element, a: string) => Number(e.getAttribute(a));

describe('ChainageFrame', () => {
  it('draws inside the chart’s own SVG, every element of it an SVG element', async () => {
    const { el } = await render();
    const g = el.querySelector('svg > g') as Element;
    expect(g.namespaceURI).toBe(SVG);
    const drawn = Array.from(g.querySelectorAll('*'));
    expect(drawn.length).toBeGreaterThan(0);
    expect(drawn.filter((e) => e.namespaceURI !== SVG).map((e) => e.tagName)).toEqual([]);
  });

  it('draws a grid line and a label at the height of each y tick, right-aligned left of the plot', async () => {
    const { el } = await render();
    const grid = Array.from(el.querySelectorAll('line.grid'));
    expect(grid.map((l) => [num(l, 'x1'), num(l, 'x2'), num(l, 'y1'), num(l, 'y2')])).toEqual([
      [50, 380, 160, 160],
      [50, 380, 10, 10],
    ]);
    expect(grid.every((l) => l.getAttribute('stroke') === CHAINAGE_STYLE.grid.stroke)).toBe(true);
    const labels = Array.from(el.querySelectorAll('text.tick[text-anchor="end"]'));
    expect(labels.map((t) => [t.textContent?.trim(), num(t, 'x'), num(t, 'y')])).toEqual([
      ['0', 44, 164],
      ['2', 44, 14],
    ]);
  });

  it('marks each chainage tick under the plot, with its label centred under the mark', async () => {
    const { el } = await render();
    const labels = Array.from(el.querySelectorAll('text.tick[text-anchor="middle"]'));
    expect(labels.map((t) => [t.textContent?.trim(), num(t, 'x'), num(t, 'y')])).toEqual([
      ['1+000', 60, 178],
      ['1+050', 215, 178],
      ['1+100', 370, 178],
    ]);
    const marks = Array.from(el.querySelectorAll('line:not(.grid):not(.axis)'));
    expect(marks.map((l) => [num(l, 'x1'), num(l, 'x2'), num(l, 'y1'), num(l, 'y2')])).toEqual([
      [60, 60, 160, 165],
      [215, 215, 160, 165],
      [370, 370, 160, 165],
    ]);
    for (const t of el.querySelectorAll('text.tick')) {
      expect(t.getAttribute('fill')).toBe(CHAINAGE_STYLE.tick.fill);
    }
  });

  it('draws the two axes along the left and the bottom of the plot', async () => {
    const { el } = await render();
    const axes = Array.from(el.querySelectorAll('line.axis'));
    expect(axes.map((l) => [num(l, 'x1'), num(l, 'x2'), num(l, 'y1'), num(l, 'y2')])).toEqual([
      [50, 380, 160, 160],
      [50, 50, 10, 160],
    ]);
    expect(axes.every((l) => l.getAttribute('stroke') === CHAINAGE_STYLE.axis.stroke)).toBe(true);
  });

  it('titles the chainage with the batch’s length unit, and the y axis with the caller’s words', async () => {
    const { fixture, el } = await render();
    const x = () => el.querySelector('text.axis-title[data-axis="x"]') as Element;
    const y = () => el.querySelector('text.axis-title[data-axis="y"]') as Element;
    expect(x().textContent?.trim()).toBe('Chainage (m)');
    expect([num(x(), 'x'), num(x(), 'y')]).toEqual([215, 194]);
    expect(y().textContent?.trim()).toBe('Factor of safety');
    expect(y().getAttribute('transform')).toBe('translate(14 85) rotate(-90)');
    expect(x().getAttribute('fill')).toBe(CHAINAGE_STYLE.title.fill);

    fixture.componentInstance.units.set('us');
    fixture.componentInstance.yTitle.set('P(FS < 1)');
    await fixture.whenStable();
    expect(x().textContent?.trim()).toBe('Chainage (ft)');
    expect(y().textContent?.trim()).toBe('P(FS < 1)');

    fixture.componentInstance.units.set(null);
    await fixture.whenStable();
    expect(x().textContent?.trim()).toBe('Chainage');
  });

  it('follows a new layout: ticks come and go with it', async () => {
    const { fixture, el } = await render();
    fixture.componentInstance.frame.set({
      ...FRAME,
      yTicks: [...FRAME.yTicks, { value: 1, y: 85, text: '1' }],
      xTicks: FRAME.xTicks.slice(0, 1),
    });
    await fixture.whenStable();
    expect(el.querySelectorAll('line.grid')).toHaveLength(3);
    expect(el.querySelectorAll('text.tick[text-anchor="middle"]')).toHaveLength(1);
  });
});
