import { writeFileSync } from 'node:fs';
import {
  CAUTION,
  analyzeSection,
  caseView,
  sectionOfCase,
  drawSection,
  formatMessage,
  fsText,
  isGeoJsonCorridor,
  parseGeoJsonCorridor,
  parseSections,
  type Section,
} from '@scarpline/core';
import { applyOverrides, type Overrides } from './overrides';
import { readInput, STDIN_NAME, UserError } from './read-input';
import { svgToPng } from '@scarpline/report';

export interface PlotOptions extends Overrides {
  /** The SVG file to write (at least one of svg and png is given). */
  svg?: string;
  /** The PNG file to write: the same drawing rendered. */
  png?: string;
  section?: string;
  /** The design case to draw; the governing case of each section when not given. */
  case?: string;
  width?: number;
  /** Draw each circle's radii to the ends of its arc. */
  radii?: boolean;
}

/** The file name for one of several sections: `out.svg` → `out-<id>.svg` (`.png` alike). */
export const svgNameFor = (out: string, id: string, ext = 'svg'): string =>
  out.replace(new RegExp(`(\\.${ext})?$`, 'i'), `-${id.replace(/[^A-Za-z0-9._+@-]/g, '_')}.${ext}`);

/** The sections of any input file: a section file, a batch, or a GeoJSON corridor. */
export function readSections(file: string): {
  name: string;
  sections: Section[];
  errors: string[];
  warnings: string[];
} {
  const input = readInput(file);
  const parsed = isGeoJsonCorridor(input.text)
    ? parseGeoJsonCorridor(input.text, input.name)
    : parseSections(input.text, input.name === STDIN_NAME ? 'stdin.yaml' : input.name);
  const line = (m: (typeof parsed.messages)[number]) =>
    formatMessage(m.file === 'stdin.yaml' ? { ...m, file: STDIN_NAME } : m);
  return {
    name: input.name,
    sections: parsed.sections,
    errors: parsed.messages.filter((m) => m.severity === 'error').map(line),
    warnings: parsed.messages.filter((m) => m.severity === 'warning').map(line),
  };
}

/**
 * `scarpline plot`: analyze the sections of a file and write the cross-section drawing as
 * SVG: one section to `--svg OUT`, several to `OUT-<id>.svg` each (or the one `--section ID`
 * names), and the same drawing as PNG to `--png OUT` alike; each with its governing FS on
 * standard output and then the caution (the drawing carries it too). Returns the exit code: 0 when drawn, 1 on bad input.
 */
export function plotFile(
  file: string,
  options: PlotOptions,
  out: (line: string) => void,
  err: (line: string) => void,
): number {
  if (!options.svg && !options.png)
    throw new UserError('plot: give --svg <out>, --png <out> or both');
  const { sections, errors, warnings } = readSections(file);
  for (const m of [...errors, ...warnings]) err(m);
  if (errors.length) return 1;
  let chosen = sections;
  if (options.section) {
    chosen = sections.filter((s) => s.id === options.section);
    if (chosen.length === 0)
      throw new UserError(
        `--section: no section ${JSON.stringify(options.section)} in ${file}; it has ${sections.map((s) => s.id).join(', ')}`,
      );
  }
  for (const s of chosen) {
    const section = applyOverrides(s, options);
    const station = analyzeSection(section);
    const names = station.cases.map((c) => c.name);
    if (options.case !== undefined && !names.includes(options.case))
      throw new UserError(
        `--case: no case ${JSON.stringify(options.case)} in ${s.id}; it has ${names.join(', ')}`,
      );
    const name = options.case ?? station.governing?.case;
    const result = caseView(station, name);
    const svg = drawSection(sectionOfCase(section, result.case ?? undefined), result, {
      width: options.width,
      radii: options.radii,
    });
    const paths: string[] = [];
    if (options.svg) {
      const path = chosen.length === 1 ? options.svg : svgNameFor(options.svg, s.id);
      writeFileSync(path, `${svg}\n`);
      paths.push(path);
    }
    if (options.png) {
      const path = chosen.length === 1 ? options.png : svgNameFor(options.png, s.id, 'png');
      writeFileSync(path, svgToPng(svg));
      paths.push(path);
    }
    const fs = result.governing
      ? `governing FS ${fsText(result.governing.fs)} (${result.governing.method})`
      : 'no method converged';
    const drawn = station.cases.length > 1 ? `, case ${result.case}` : '';
    out(`wrote ${paths.join(' and ')}: ${s.id}${drawn}, ${fs}`);
  }
  if (chosen.length) out(`Caution: ${CAUTION}`);
  return 0;
}
