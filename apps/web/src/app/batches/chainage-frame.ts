import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { CHAINAGE_STYLE, type ChainageLayout } from '@scarpline/core/draw';
import { lengthUnit, type Units } from './scales';

/** What the frame draws: the drawing's size, the plot area and the ticks, in pixels. */
export type ChainageFrameLayout = Pick<
  ChainageLayout,
  'width' | 'height' | 'plot' | 'xTicks' | 'yTicks'
>;

/**
 * The frame of a chart along the chainage: the plot area's axes, the grid line and label of
 * each y tick (the caller's: FS, or decades of a probability), the chainage's ticks under the
 * plot, and the two axis titles, in the core's look (CHAINAGE_STYLE, the same as the command's
 * chainage.svg). The governing FS and the probability of failure draw their marks over it.
 *
 * Used on an SVG group inside the chart's own <svg> (an element of its own would not be drawn
 * there): `<g slChainageFrame [frame]="layout" [units]="units" yTitle="Factor of safety" />`.
 */
@Component({
  // an SVG group: the browser draws no element of a name of ours inside an <svg>
  // eslint-disable-next-line @angular-eslint/component-selector
  selector: 'g[slChainageFrame]',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './chainage-frame.html',
  styleUrl: './chainage-frame.scss',
})
export class ChainageFrame {
  readonly frame = input.required<ChainageFrameLayout>();
  /** The batch's unit system: the chainage's unit in the x title (none when unknown). */
  readonly units = input<Units | null>(null);
  /** The y axis's title. */
  readonly yTitle = input.required<string>();

  protected readonly style = CHAINAGE_STYLE;
  protected readonly xTitle = computed(() => {
    const u = lengthUnit(this.units());
    return u ? `Chainage (${u})` : 'Chainage';
  });
}
