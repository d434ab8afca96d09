import { svgToPng } from '@scarpline/report';
import type { Principal } from './auth';
import { sectionSvg } from './exports';

/**
 * The section drawing as PNG: the same SVG as plot.svg (its geometry already cut to the plot
 * area in code, the caution on it) rendered by resvg, whose binary ships in its npm package.
 * The drawing's pixel size, on a white ground; text in the system's fonts.
 */
export async function sectionPng(p: Principal, sectionId: number, caseName?: string) {
  const { svg, fileName } = await sectionSvg(p, sectionId, caseName);
  return {
    png: svgToPng(svg),
    fileName: fileName.replace(/\.svg$/, '.png'),
  };
}
