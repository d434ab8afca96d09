import { yAt } from '../geometry/y-at';
import type { Polyline } from '../model/types';
import { isNumber, isPoint, isPointList, isRecord } from './guards';
import type { PathKey } from './types';
import { num, quoteText } from './words';

type Report = (path: PathKey[], code: string, message: string) => void;

/**
 * The checks of a section's reinforcement that the schema cannot express (in the file's
 * units, each part only where its shape allows). Errors: two elements of one name; a level
 * layer whose `to` is not beyond its `from`, or a polyline layer whose x does not increase; a
 * nail, anchor head or pile off the ground's x-range; a pile whose top is not above its
 * bottom; a required reinforcement whose `to` is not beyond its `from`. Warnings: a layer
 * wholly above the ground, a head well above the ground (more than 0.5 m or ft), a pile whose
 * bottom is above the ground.
 */
export function checkReinforcement(
  data: Record<string, unknown>,
  ground: Polyline | null,
  L: string,
  err: Report,
  warn: Report,
): void {
  const gx0 = ground ? ground[0][0] : -Infinity;
  const gx1 = ground ? ground[ground.length - 1][0] : Infinity;
  const off = (x: number) => ground !== null && (x < gx0 || x > gx1);
  const groundAt = (x: number) => (ground ? yAt(ground, x) : NaN);
  const range = `the ground (x = ${num(gx0)} to ${num(gx1)} ${L})`;
  const list = Array.isArray(data.reinforcement) ? data.reinforcement : [];
  const seen = new Map<string, number>();
  list.forEach((r, i) => {
    if (!isRecord(r)) return;
    const at = (...k: PathKey[]): PathKey[] => ['reinforcement', i, ...k];
    if (typeof r.name === 'string') {
      const first = seen.get(r.name);
      if (first !== undefined)
        err(
          at('name'),
          'reinforcement-name',
          `${quoteText(r.name)} is also the name of element ${first + 1}: give each element a name of its own`,
        );
      else seen.set(r.name, i);
    }
    if (r.type === 'geosynthetic') {
      if (isNumber(r.from) && isNumber(r.to) && !(r.to > r.from))
        err(
          at('to'),
          'reinforcement-extent',
          `to (x = ${num(r.to)}) must be greater than from (x = ${num(r.from)})`,
        );
      if (isPointList(r.points)) {
        const p = r.points;
        for (let k = 1; k < p.length; k++)
          if (!(p[k][0] > p[k - 1][0]))
            err(
              at('points', k),
              'reinforcement-x-order',
              `x = ${num(p[k][0])} does not increase from the point before (x = ${num(p[k - 1][0])})`,
            );
        if (ground && p.every(([x, y]) => !off(x) && y > groundAt(x)))
          warn(
            at('points'),
            'reinforcement-above-ground',
            'the layer lies wholly above the ground: no slip surface can cross it',
          );
      }
      if (isNumber(r.elevation) && ground) {
        const from = isNumber(r.from) ? r.from : gx0;
        const to = isNumber(r.to) ? r.to : gx1;
        if (off(from) || off(to))
          err(
            at(isNumber(r.from) && off(from) ? 'from' : 'to'),
            'reinforcement-outside',
            `the layer from x = ${num(from)} to ${num(to)} ${L} reaches beyond ${range}`,
          );
        else {
          const elevation = r.elevation;
          const xs = [from, ...ground.map((g) => g[0]).filter((x) => x > from && x < to), to];
          if (xs.every((x) => elevation > groundAt(x)))
            warn(
              at('elevation'),
              'reinforcement-above-ground',
              `the layer at ${num(elevation)} ${L} lies wholly above the ground: no slip surface can cross it`,
            );
        }
      }
    }
    if ((r.type === 'nail' || r.type === 'anchor') && isPoint(r.head)) {
      const [x, y] = r.head;
      if (off(x))
        err(at('head'), 'reinforcement-outside', `the head at x = ${num(x)} ${L} is off ${range}`);
      else if (ground && y > groundAt(x) + 0.5)
        warn(
          at('head'),
          'reinforcement-above-ground',
          `the head is ${num(y - groundAt(x))} ${L} above the ground: put it on the face`,
        );
    }
    if (r.type === 'pile' && isNumber(r.x)) {
      if (off(r.x)) err(at('x'), 'reinforcement-outside', `x = ${num(r.x)} ${L} is off ${range}`);
      if (isNumber(r.top) && isNumber(r.bottom) && !(r.top > r.bottom))
        err(
          at('top'),
          'reinforcement-extent',
          `the top (${num(r.top)} ${L}) must be above the bottom (${num(r.bottom)} ${L})`,
        );
      else if (ground && !off(r.x) && isNumber(r.bottom) && r.bottom >= groundAt(r.x))
        warn(
          at('bottom'),
          'reinforcement-above-ground',
          `the bottom (${num(r.bottom)} ${L}) is not below the ground: no slip surface can cross the pile`,
        );
    }
  });
  const analysis = isRecord(data.analysis) ? data.analysis : null;
  const req =
    analysis && isRecord(analysis.requiredReinforcement) ? analysis.requiredReinforcement : null;
  if (req && isNumber(req.from) && isNumber(req.to) && !(req.to > req.from))
    err(
      ['analysis', 'requiredReinforcement', 'to'],
      'reinforcement-extent',
      `to (x = ${num(req.to)}) must be greater than from (x = ${num(req.from)})`,
    );
}
