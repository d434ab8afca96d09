/**
 * Stored results and inputs in the words of this version:
 * - the method id swedish-circle is phi-zero-circle (results' methods, governing method and
 *   warnings; inputs' methods), from the core's table of renamed ids;
 * - a Morgenstern–Price interslice function of a former shape (clipped-sine, trapezoid) is the
 *   piecewise-linear function the core gives for it (the trapezoid exactly, the clipped sine
 *   through eleven points);
 * - a slice's interslice forces that its method does not compute are null, not 0 (E of every
 *   method but Janbu, Spencer and Morgenstern–Price; X of every method but the last two);
 * - the search's ten lowest circles become its trial band: those within 5 % of the least of
 *   them (how many more the search tried within it was not recorded: the count is of these).
 * Down undoes the ids, the nulls and the band; a piecewise-linear input stays as it is.
 */
import { QueryTypes, type QueryInterface } from 'sequelize';
import { formerInterslice, RENAMED_METHODS } from '@scarpline/core/model';

type Json = Record<string, unknown>;
type Direction = 'up' | 'down';

const COMPUTES: Record<string, { E: boolean; X: boolean }> = {
  janbu: { E: true, X: false },
  spencer: { E: true, X: true },
  'morgenstern-price': { E: true, X: true },
};

const isObject = (v: unknown): v is Json =>
  v !== null && typeof v === 'object' && !Array.isArray(v);

function methodId(id: unknown, d: Direction): unknown {
  if (typeof id !== 'string') return id;
  const map =
    d === 'up'
      ? RENAMED_METHODS
      : Object.fromEntries(Object.entries(RENAMED_METHODS).map(([a, b]) => [b, a]));
  return map[id] ?? id;
}

/** Every id in a text (a warning's message) renamed. */
function renameInText(text: unknown, d: Direction): unknown {
  if (typeof text !== 'string') return text;
  let out = text;
  for (const [from, to] of Object.entries(RENAMED_METHODS))
    out = d === 'up' ? out.split(from).join(to) : out.split(to).join(from);
  return out;
}

/** A section input (its analysis: methods and interslice function). */
function input(v: unknown, d: Direction): unknown {
  if (!isObject(v) || !isObject(v.analysis)) return v;
  const a = { ...v.analysis };
  if (Array.isArray(a.methods)) a.methods = (a.methods as unknown[]).map((m) => methodId(m, d));
  if (d === 'up' && isObject(a.interslice))
    a.interslice = formerInterslice(a.interslice) ?? a.interslice;
  return { ...v, analysis: a };
}

function warnings(v: unknown, d: Direction): unknown {
  if (!Array.isArray(v)) return v;
  return (v as unknown[]).map((w) =>
    isObject(w)
      ? {
          ...w,
          ...(w.method !== undefined ? { method: methodId(w.method, d) } : {}),
          message: renameInText(w.message, d),
        }
      : w,
  );
}

function methods(v: unknown, d: Direction): unknown {
  if (!Array.isArray(v)) return v;
  return (v as unknown[]).map((m) => {
    if (!isObject(m)) return m;
    const id = methodId(m.method, d);
    const computes = COMPUTES[String(m.method)] ?? { E: false, X: false };
    const slices = Array.isArray(m.slices)
      ? (m.slices as unknown[]).map((s) => {
          if (!isObject(s) || !isObject(s.interslice)) return s;
          const f = s.interslice;
          return {
            ...s,
            interslice:
              d === 'up'
                ? { ...f, E: computes.E ? f.E : null, X: computes.X ? f.X : null }
                : { ...f, E: f.E ?? 0, X: f.X ?? 0 },
          };
        })
      : m.slices;
    return { ...m, method: id, slices, warnings: warnings(m.warnings, d) };
  });
}

function search(v: unknown, d: Direction): unknown {
  if (!isObject(v)) return v;
  if (d === 'up' && Array.isArray(v.lowest)) {
    const { lowest, ...rest } = v;
    const fs = (t: unknown) => (isObject(t) && typeof t.fs === 'number' ? t.fs : Infinity);
    const least = Math.min(...lowest.map(fs));
    const surfaces = lowest.filter((t) => fs(t) <= 1.05 * least);
    return { ...rest, trialBand: { within: 0.05, count: surfaces.length, surfaces } };
  }
  if (d === 'down' && isObject(v.trialBand)) {
    const { trialBand, ...rest } = v;
    const surfaces = Array.isArray(trialBand.surfaces) ? trialBand.surfaces : [];
    return { ...rest, lowest: surfaces.slice(0, 10) };
  }
  return v;
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

async function convert(q: QueryInterface, d: Direction): Promise<void> {
  const db = q.sequelize;
  const results = await db.query<{
    id: number;
    governing_method: string | null;
    methods: unknown;
    warnings: unknown;
    search: unknown;
    input: unknown;
  }>('SELECT id, governing_method, methods, warnings, search, input FROM results', {
    type: QueryTypes.SELECT,
  });
  for (const r of results) {
    const next = {
      governing_method: methodId(r.governing_method, d),
      methods: methods(r.methods, d),
      warnings: warnings(r.warnings, d),
      search: search(r.search, d),
      input: input(r.input, d),
    };
    if (
      next.governing_method === r.governing_method &&
      same(next.methods, r.methods) &&
      same(next.warnings, r.warnings) &&
      same(next.search, r.search) &&
      same(next.input, r.input)
    )
      continue;
    await db.query(
      `UPDATE results SET governing_method = $1, methods = $2::jsonb, warnings = $3::jsonb,
         search = $4::jsonb, input = $5::jsonb WHERE id = $6`,
      {
        bind: [
          next.governing_method,
          JSON.stringify(next.methods),
          JSON.stringify(next.warnings),
          next.search === null ? null : JSON.stringify(next.search),
          next.input === null ? null : JSON.stringify(next.input),
          r.id,
        ],
      },
    );
  }
  const sections = await db.query<{ id: number; input: unknown }>(
    'SELECT id, input FROM sections',
    { type: QueryTypes.SELECT },
  );
  for (const s of sections) {
    const next = input(s.input, d);
    if (same(next, s.input)) continue;
    await db.query('UPDATE sections SET input = $1::jsonb WHERE id = $2', {
      bind: [JSON.stringify(next), s.id],
    });
  }
}

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await convert(q, 'up');
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await convert(q, 'down');
}
