import { aboveIntervals } from './above-intervals';
import { caseOrigin, mergeCaseData } from '../model/merge-case';
import type { Polyline, UnitSystem } from '../model/types';
import { betweenWords, checkBoundary, readGround } from './check-boundary';
import { isNumber, isRecord } from './guards';
import type { Issue, PathKey } from './types';
import { closest, listWords, num, pathText, quoteText } from './words';

/** The kinds of case in which a pseudo-static kh is most likely left over from the section. */
const STATIC_KINDS = ['end-of-construction', 'long-term', 'steady-seepage', 'rapid-drawdown'];

const has = (o: Record<string, unknown>, key: string): boolean =>
  Object.prototype.hasOwnProperty.call(o, key);

/**
 * The checks of a section's design cases (data as read, in the file's units, perhaps not past
 * the schema): each case is checked as the section it sees (the section's settings with its
 * own merged in, by `checkOne`, the checks of a section's settings), and a message about a
 * setting the case gives is put at that setting in the case; one about the section's own
 * settings that the section's check (`own`) did not already give is put at the case, with
 * the section's path in its words. Besides: unique names; the materials a case or its
 * drawdown names exist; a rigid material given another strength without a unit weight;
 * governing methods among the case's methods; a rapid drawdown's water before (a piezometric
 * line) and after (spanning the ground; warned when above the water before); a seismic case's
 * earthquake without pga; kh in a case whose kind is not seismic; analysis.case unused.
 *
 * @example checkCases(data, checkSettings(data), checkSettings) // → [{ path: ['cases', 1, 'name'], code: 'case-name-twice', … }]
 */
export function checkCases(
  data: Record<string, unknown>,
  own: readonly Issue[],
  checkOne: (data: Record<string, unknown>) => Issue[],
): Issue[] {
  const issues: Issue[] = [];
  if (!Array.isArray(data.cases)) return issues;
  const units: UnitSystem = data.units === 'us' ? 'us' : 'si';
  const err = (path: PathKey[], code: string, message: string, key = false): void => {
    issues.push({ severity: 'error', path, code, message, ...(key ? { key } : {}) });
  };
  const warn = (path: PathKey[], code: string, message: string, key = false): void => {
    issues.push({ severity: 'warning', path, code, message, ...(key ? { key } : {}) });
  };
  const materials = isRecord(data.materials) ? data.materials : {};
  const names = Object.keys(materials);
  const ground = readGround(data);
  const said = new Set(own.map((i) => [pathText(i.path), i.code, i.message].join('|')));

  if (isRecord(data.analysis) && data.analysis.case !== undefined && data.cases.length > 0) {
    warn(
      ['analysis', 'case'],
      'case-unused',
      "names the section's own case, but the section lists cases: each of them has its name, and this one is not used",
    );
  }

  /** A material the section does not have, named by a case at `path`. */
  const undefinedMaterial = (name: string, path: PathKey[]): void => {
    if (has(materials, name)) return;
    const near = closest(name, names);
    const tail = near
      ? `; did you mean ${near}?`
      : names.length
        ? `; the materials are ${listWords(names, 10)}`
        : '';
    err(
      path,
      'material-undefined',
      `no material of the section is named ${quoteText(name)}${tail} (a case changes the section's materials and adds none)`,
      true,
    );
  };

  const seen = new Set<string>();
  data.cases.forEach((c: unknown, i: number) => {
    if (!isRecord(c)) return;
    const at: PathKey[] = ['cases', i];
    const kind = typeof c.kind === 'string' ? c.kind : null;

    if (typeof c.name === 'string') {
      if (!seen.has(c.name)) seen.add(c.name);
      else
        err(
          [...at, 'name'],
          'case-name-twice',
          `${quoteText(c.name)} is the name of an earlier case too; give each case a name of its own`,
        );
    }
    if (isRecord(c.materials))
      for (const name of Object.keys(c.materials))
        undefinedMaterial(name, [...at, 'materials', name]);
    const drawdown = isRecord(c.drawdown) ? c.drawdown : null;
    if (drawdown && isRecord(drawdown.materials))
      for (const name of Object.keys(drawdown.materials))
        undefinedMaterial(name, [...at, 'drawdown', 'materials', name]);

    // The section as this case sees it, checked as a section is.
    const view = mergeCaseData(data, c);
    for (const issue of checkOne(view)) {
      const from = caseOrigin(c, issue.path);
      if (from) issues.push({ ...issue, path: [...at, ...from] });
      else if (!said.has([pathText(issue.path), issue.code, issue.message].join('|'))) {
        issues.push({
          severity: issue.severity,
          path: at,
          code: issue.code,
          message: `with this case's settings, ${pathText(issue.path)}: ${issue.message}`,
        });
      }
    }

    // A rigid material given another strength needs a unit weight.
    const merged = isRecord(view.materials) ? view.materials : {};
    if (isRecord(c.materials)) {
      for (const [name, m] of Object.entries(c.materials)) {
        const whole = merged[name];
        if (!isRecord(m) || !isRecord(m.strength) || !isRecord(whole)) continue;
        const model = m.strength.model;
        if (typeof model === 'string' && model !== 'rigid' && whole.unitWeight === undefined) {
          err(
            [...at, 'materials', name, 'strength'],
            'missing',
            `unitWeight is missing: ${name} has none in the section (a rigid base), and a ${model} strength needs one; give unitWeight here too`,
          );
        }
      }
    }

    // Governing methods are among the methods asked.
    const a = isRecord(view.analysis) ? view.analysis : {};
    const methods = Array.isArray(a.methods) ? a.methods.map(String) : ['bishop'];
    if (Array.isArray(c.governs)) {
      c.governs.forEach((m: unknown, k: number) => {
        if (typeof m === 'string' && !methods.includes(m)) {
          err(
            [...at, 'governs', k],
            'governs-not-asked',
            `${m} is not among this case's methods (${listWords(methods)}): add it to analysis.methods, or leave it out of governs`,
          );
        }
      });
    }

    // A rapid drawdown: the water before it is a piezometric line; the water after spans the ground.
    const water = isRecord(view.water) ? view.water : {};
    if (kind === 'rapid-drawdown' && water.piezometric === undefined) {
      const words = water.ru !== undefined ? ', not ru' : '';
      err(
        c.water !== undefined ? [...at, 'water'] : [...at, 'kind'],
        'drawdown-water-before',
        `a rapid-drawdown case needs the water before drawdown as a piezometric line${words}: give water: { piezometric: … } in the case or in the section`,
      );
    }
    if (drawdown && isRecord(drawdown.after) && drawdown.after.piezometric !== undefined) {
      const path: PathKey[] = [...at, 'drawdown', 'after', 'piezometric'];
      const what = 'the piezometric line after drawdown';
      const after = checkBoundary(drawdown.after.piezometric, path, what, ground, units, issues);
      const before: Polyline | null =
        ground && water.piezometric !== undefined
          ? checkBoundary(water.piezometric, [], '', ground, units, [])
          : null;
      const rises = after && before ? aboveIntervals(after, before) : [];
      if (rises.length) {
        warn(
          path,
          'drawdown-rises',
          `is above the water before drawdown ${betweenWords(rises, units)}: after a drawdown the water is normally lower`,
        );
      }
    }
    if (drawdown && isRecord(drawdown.materials)) {
      for (const [name, d] of Object.entries(drawdown.materials)) {
        const m = merged[name];
        if (isRecord(d) && isRecord(m) && isRecord(m.strength) && m.strength.model === 'rigid') {
          warn(
            [...at, 'drawdown', 'materials', name],
            'drawdown-rigid',
            `${name} is a rigid base in this case: how it drains is not used`,
            true,
          );
        }
      }
    }

    // The earthquake of a seismic case: a displacement needs the peak ground acceleration.
    const quake = isRecord(c.earthquake) ? c.earthquake : null;
    if (
      quake &&
      quake.pga === undefined &&
      (quake.allowableDisplacement !== undefined || quake.magnitude !== undefined)
    ) {
      warn(
        [...at, 'earthquake'],
        'earthquake-no-pga',
        'gives no pga: no displacement is estimated, only the yield coefficient ky; give pga (the design peak ground acceleration, in g)',
      );
    }

    // kh in a case that is not an earthquake case: most likely the section's, left over.
    const seismic = isRecord(view.seismic) ? view.seismic : {};
    if (kind && STATIC_KINDS.includes(kind) && isNumber(seismic.kh) && seismic.kh > 0) {
      const mine = isRecord(c.seismic) && c.seismic.kh !== undefined;
      warn(
        mine ? [...at, 'seismic', 'kh'] : [...at, 'kind'],
        'kh-not-seismic',
        mine
          ? `kh = ${num(seismic.kh)} in a ${kind} case: a pseudo-static load in a case that is not seismic; make its kind seismic, or leave kh out`
          : `${kind}, but the section's seismic kh = ${num(seismic.kh)} applies to this case: give it seismic: { kh: 0 }, or make its kind seismic`,
      );
    }
  });
  return issues;
}
