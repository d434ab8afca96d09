import { cholesky } from '../probability/cholesky';
import { parseTarget } from '../probability/target';
import { isNumber, isRecord } from './guards';
import type { Issue, PathKey } from './types';
import { num, quoteText } from './words';

const has = (o: Record<string, unknown>, key: string): boolean =>
  Object.prototype.hasOwnProperty.call(o, key);

/** Whether the section (or one of its cases) has a piezometric line or ru. */
function hasWater(data: Record<string, unknown>, key: 'piezometric' | 'ru'): boolean {
  const waters = [data.water];
  if (Array.isArray(data.cases)) for (const c of data.cases) if (isRecord(c)) waters.push(c.water);
  return waters.some((w) => isRecord(w) && w[key] !== undefined);
}

/** Why the section (as read, in the file's units) has no input at a target's text, or null. */
function missing(data: Record<string, unknown>, text: string): string | null {
  const t = parseTarget(text);
  if (!t.ok) return null;
  const target = t.target;
  switch (target.kind) {
    case 'material': {
      const materials = isRecord(data.materials) ? data.materials : {};
      const m = materials[target.material];
      if (!isRecord(m))
        return `the section has no material ${quoteText(target.material)} (it has ${Object.keys(materials).map(quoteText).join(', ')})`;
      if (target.parameter === 'unitWeight' || target.parameter === 'saturatedUnitWeight')
        return null;
      const strength = isRecord(m.strength) ? m.strength : {};
      const p = target.parameter === 'tanFrictionAngle' ? 'frictionAngle' : target.parameter;
      if (has(strength, p)) return null;
      return `material ${quoteText(target.material)} (${String(strength.model)}) gives no ${p}`;
    }
    case 'water':
      if (hasWater(data, target.parameter === 'level' ? 'piezometric' : 'ru')) return null;
      return target.parameter === 'level'
        ? 'water.level shifts the piezometric line, and the section gives none'
        : 'the section gives no ru';
    case 'load': {
      const loads = Array.isArray(data.loads) ? data.loads : [];
      const l: unknown = loads[target.index];
      if (!isRecord(l))
        return `the section has ${loads.length} loads: there is no load ${target.index} (counted from 0)`;
      const optional = target.parameter === 'angle' && l.type === 'line';
      if (has(l, target.parameter) || optional) return null;
      return `load ${target.index} (a ${String(l.type)} load) has no ${target.parameter}`;
    }
    case 'ground': {
      const g = Array.isArray(data.ground) ? data.ground : [];
      return target.index < g.length
        ? null
        : `the ground has ${g.length} points: there is no point ${target.index} (counted from 0)`;
    }
    case 'infinite-slope': {
      const a = isRecord(data.analysis) ? data.analysis : {};
      return isRecord(a.infiniteSlope)
        ? null
        : 'the section gives no infinite slope (analysis.infiniteSlope)';
    }
    case 'reinforcement': {
      const list = Array.isArray(data.reinforcement) ? data.reinforcement : [];
      const r: unknown = list.find((e) => isRecord(e) && e.name === target.name);
      if (!isRecord(r)) return `the section has no reinforcement named ${quoteText(target.name)}`;
      return has(r, target.parameter)
        ? null
        : `reinforcement ${quoteText(target.name)} (${String(r.type)}) gives no ${target.parameter}`;
    }
    case 'seismic':
      return null;
  }
}

/**
 * The checks of a section's `probability` that the schema cannot express (data as read, in
 * the file's units): each target's form and that the section has it; sd or cov, not both; a
 * lognormal mean above 0; min below max and a triangular mode between them; variable names
 * unique; correlations between named, different variables, each pair once, and possible
 * together (their matrix positive definite).
 *
 * @example checkProbability(data) // → [{ path: ['probability', 'variables', 0, 'target'], code: 'target-unknown', … }]
 */
export function checkProbability(data: Record<string, unknown>): Issue[] {
  const issues: Issue[] = [];
  const p = data.probability;
  if (!isRecord(p) || !Array.isArray(p.variables)) return issues;
  const P: PathKey[] = ['probability'];
  const err = (path: PathKey[], code: string, message: string) =>
    issues.push({ severity: 'error', path, code, message });
  const names: string[] = [];
  p.variables.forEach((v: unknown, i: number) => {
    const V: PathKey[] = [...P, 'variables', i];
    if (!isRecord(v)) return;
    if (typeof v.target === 'string') {
      const t = parseTarget(v.target);
      if (!t.ok) err([...V, 'target'], 'target-unknown', t.reason);
      else {
        const why = missing(data, v.target);
        if (why) err([...V, 'target'], 'target-missing', `${quoteText(v.target)}: ${why}`);
      }
    }
    const name =
      typeof v.name === 'string' ? v.name : typeof v.target === 'string' ? v.target : null;
    if (name !== null) {
      if (names.includes(name))
        err(
          [...V, typeof v.name === 'string' ? 'name' : 'target'],
          'variable-twice',
          `two variables are named ${quoteText(name)}: give each its own name (and vary each input once)`,
        );
      names.push(name);
    }
    const kind = v.distribution;
    const normalLike = kind === 'normal' || kind === 'lognormal' || kind === 'truncated-normal';
    if (normalLike) {
      if (v.sd !== undefined && v.cov !== undefined)
        err([...V, 'cov'], 'sd-and-cov', 'give sd or cov, not both');
      else if (v.sd === undefined && v.cov === undefined)
        err(V, 'sd-missing', `a ${String(kind)} variable needs sd or cov`);
      else if (v.cov !== undefined && isNumber(v.mean) && v.mean === 0)
        err([...V, 'cov'], 'cov-of-zero-mean', 'cov is SD/|mean| and the mean is 0: give sd');
    }
    if (kind === 'lognormal' && isNumber(v.mean) && !(v.mean > 0))
      err(
        [...V, 'mean'],
        'lognormal-mean',
        `a lognormal variable's mean must be above 0 (it is ${num(v.mean)})`,
      );
    if (isNumber(v.min) && isNumber(v.max) && !(v.min < v.max))
      err(
        [...V, 'max'],
        'min-not-below-max',
        `min (${num(v.min)}) must be below max (${num(v.max)})`,
      );
    if (
      kind === 'triangular' &&
      isNumber(v.min) &&
      isNumber(v.max) &&
      isNumber(v.mode) &&
      !(v.mode >= v.min && v.mode <= v.max)
    )
      err([...V, 'mode'], 'mode-outside', `the mode (${num(v.mode)}) must lie between min and max`);
  });
  if (!Array.isArray(p.correlations)) return issues;
  const c = names.map((_, i) => names.map((__, j): number => (i === j ? 1 : 0)));
  const seen = new Set<string>();
  let complete = true;
  p.correlations.forEach((k: unknown, j: number) => {
    const K: PathKey[] = [...P, 'correlations', j];
    if (!isRecord(k) || !Array.isArray(k.between) || !isNumber(k.coefficient))
      return (complete = false);
    const [a, b] = k.between as unknown[];
    const ia = names.indexOf(String(a));
    const ib = names.indexOf(String(b));
    for (const [w, at] of [
      [a, ia],
      [b, ib],
    ] as const)
      if (at < 0)
        err(
          [...K, 'between'],
          'correlation-variable',
          `no variable is named ${quoteText(String(w))} (there are ${names.map(quoteText).join(', ')})`,
        );
    if (ia < 0 || ib < 0) return (complete = false);
    if (ia === ib)
      return err(
        [...K, 'between'],
        'correlation-self',
        'a correlation is between two different variables',
      );
    const key = [ia, ib].sort().join(' ');
    if (seen.has(key))
      err(
        [...K, 'between'],
        'correlation-twice',
        `the pair ${quoteText(String(a))}, ${quoteText(String(b))} is given twice`,
      );
    seen.add(key);
    c[ia][ib] = c[ib][ia] = k.coefficient;
  });
  if (complete && p.correlations.length > 0 && !cholesky(c))
    err(
      [...P, 'correlations'],
      'correlations-impossible',
      'these correlations cannot hold together (their matrix is not positive definite): make the coefficients smaller',
    );
  return issues;
}
