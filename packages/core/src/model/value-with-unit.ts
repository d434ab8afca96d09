/**
 * Values written with their unit in a section or batch file (`cohesion: 250 psf`,
 * `unitWeight: 18.5 kN/m³`, `depth: 12 ft`): read, checked for dimension and converted to the
 * file's unit system by mathjs. mathjs takes a few hundred milliseconds to load and set up, so
 * it is loaded on the first such value, never for a file of plain numbers. The conversion factors of the
 * product stay in units.ts; this module only reads what a user wrote.
 */
import type { MathJsInstance, Unit } from 'mathjs';
import type { UnitSystem } from './types';
import { UNIT_LABELS, type QuantityKind } from './units';

/**
 * A number followed by a unit, as the schemas accept it in place of a plain number (the
 * `pattern` of the quantity definitions in schemas/section.schema.json). Whether the unit
 * exists and has the right dimension is for readValueWithUnit to say.
 *
 * @example new RegExp(VALUE_WITH_UNIT_PATTERN).test('250 psf') // → true
 */
export const VALUE_WITH_UNIT_PATTERN =
  '^\\s*[-+]?(?:\\d+(?:\\.\\d*)?|\\.\\d+)(?:[eE][-+]?\\d+)?\\s*[A-Za-zµ][A-Za-z0-9µ²³^/*·()\\s-]*$';

const VALUE_WITH_UNIT = new RegExp(VALUE_WITH_UNIT_PATTERN, 'u');
const LEADING_NUMBER = /^\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$/su;

/**
 * Whether a text is a number with a unit (and so for readValueWithUnit), without loading mathjs.
 *
 * @example isValueWithUnit('12 ft') // → true
 * @example isValueWithUnit('auto') // → false
 */
export function isValueWithUnit(text: string): boolean {
  return VALUE_WITH_UNIT.test(text);
}

/** What a kind of quantity is called in messages, and an example of it in each system. */
const KIND_WORDS: Record<QuantityKind, { noun: string; examples: string }> = {
  length: { noun: 'a length', examples: '"12 ft" or "3.5 m"' },
  force: { noun: 'a force', examples: '"500 lbf" or "2 kN"' },
  forcePerLength: { noun: 'a force per length', examples: '"50 kN/m" or "3000 lbf/ft"' },
  pressure: { noun: 'a pressure', examples: '"12 kPa" or "250 psf"' },
  unitWeight: { noun: 'a unit weight', examples: '"18.5 kN/m³" or "120 pcf"' },
  pressurePerLength: {
    noun: 'a rate of pressure with depth',
    examples: '"1.5 kPa/m" or "10 psf/ft"',
  },
  displacement: { noun: 'a displacement', examples: '"150 mm" or "6 in"' },
};

/**
 * The words for a kind of quantity in messages.
 *
 * @example quantityWords('pressure') // → { noun: 'a pressure', examples: '"12 kPa" or "250 psf"' }
 */
export function quantityWords(kind: QuantityKind): { noun: string; examples: string } {
  return KIND_WORDS[kind];
}

/** Units written in the trade, to suggest when one is written in the wrong case (`kpa`). */
const COMMON_UNITS = [
  ...['m', 'mm', 'cm', 'km', 'ft', 'in', 'yd'],
  ...['N', 'kN', 'MN', 'lbf', 'kip'],
  ...['Pa', 'kPa', 'MPa', 'psf', 'ksf', 'tsf', 'psi'],
  ...['pcf', 'plf', 'klf'],
];

/** Superscripts and the middle dot as mathjs reads them. */
function mathjsText(unitText: string): string {
  return unitText.replace(/²/g, '^2').replace(/³/g, '^3').replace(/·/g, ' * ');
}

// The CommonJS build's `require`, declared here so that the core needs no Node types.
declare const require: (id: string) => unknown;

let math: MathJsInstance | null = null;

/**
 * mathjs, loaded on first use, in an instance of its own with the units of the trade it lacks:
 * psf, ksf and tsf (short ton-force per ft², 2000 lbf), pcf, plf and klf; and kip and psi
 * as exactly 1000 lbf and 1 lbf/in² (mathjs's own are rounded decimals). Each is defined from
 * mathjs's lbf, ft and in, which are the exact NIST SP 811 values (common practice for the
 * abbreviations).
 */
function mathjs(): MathJsInstance {
  if (!math) {
    // mathjs's bundled build (an entry its package exports): the same library as one file,
    // which loads in about a tenth of the time of its tree of modules
    const { create, all } = require('mathjs/lib/browser/math.js') as typeof import('mathjs');
    const m = create(all);
    m.createUnit(
      {
        psf: '1 lbf/ft^2',
        ksf: '1000 lbf/ft^2',
        tsf: '2000 lbf/ft^2',
        pcf: '1 lbf/ft^3',
        plf: '1 lbf/ft',
        klf: '1000 lbf/ft',
        kip: '1000 lbf',
        psi: '1 lbf/in^2',
      },
      { override: true },
    );
    math = m;
  }
  return math;
}

/** The reference unit of each kind in each system, as mathjs writes it (UNIT_LABELS). */
function systemUnit(m: MathJsInstance, kind: QuantityKind, units: UnitSystem): Unit {
  return m.unit(mathjsText(UNIT_LABELS[units][kind]));
}

/** A value with its unit read: the number in the file's unit, or why it cannot be read. */
export type ValueWithUnit =
  | { ok: true; value: number }
  | { ok: false; code: 'unknown-unit' | 'wrong-dimension' | 'unreadable'; message: string };

/**
 * A value written with its unit, converted to the unit of its kind in the file's system (ft,
 * psf, pcf, lbf/ft, psf/ft, and in for a displacement in `us`; m, kPa, kN/m³, kN/m, kPa/m,
 * and mm for a displacement in `si`). A value already in that unit keeps its number exactly.
 * A unit of another dimension (a force where a pressure belongs) or an unknown unit is an error
 * with a message in plain words. Loads mathjs on first use.
 *
 * @example readValueWithUnit('35 kPa', 'pressure', 'us') // → { ok: true, value: 730.99… }
 * @example readValueWithUnit('12 kN', 'pressure', 'si').ok // → false (a force, not a pressure)
 */
export function readValueWithUnit(
  text: string,
  kind: QuantityKind,
  units: UnitSystem,
): ValueWithUnit {
  const { noun, examples } = KIND_WORDS[kind];
  const parts = LEADING_NUMBER.exec(text);
  if (!parts || !isValueWithUnit(text)) {
    return {
      ok: false,
      code: 'unreadable',
      message: `${JSON.stringify(text)} is not a number with a unit; give ${noun}, e.g. ${examples}`,
    };
  }
  const number = Number(parts[1]);
  const m = mathjs();
  let written: Unit;
  try {
    written = m.unit(mathjsText(parts[2]));
  } catch (e) {
    const said = e instanceof Error ? e.message : String(e);
    const unknown = /Unit "([^"]*)" not found/.exec(said);
    if (unknown) {
      const near = COMMON_UNITS.find((u) => u.toLowerCase() === unknown[1].toLowerCase());
      const hint = near ? `; did you mean ${near}?` : `; give ${noun}, e.g. ${examples}`;
      return {
        ok: false,
        code: 'unknown-unit',
        message: `${JSON.stringify(text)}: ${unknown[1]} is not a unit Scarpline knows${hint}`,
      };
    }
    return {
      ok: false,
      code: 'unreadable',
      message: `${JSON.stringify(text)} cannot be read as a unit (${said.replace(/\.$/, '')}); give ${noun}, e.g. ${examples}`,
    };
  }
  const target = systemUnit(m, kind, units);
  if (!written.equalBase(target)) {
    return {
      ok: false,
      code: 'wrong-dimension',
      message: `${JSON.stringify(text)} is ${dimensionWords(m, written)}, not ${noun}; give ${noun}, e.g. ${examples}`,
    };
  }
  if (written.formatUnits() === target.formatUnits()) return { ok: true, value: number };
  return { ok: true, value: m.unit(number, written.formatUnits()).toNumber(target.formatUnits()) };
}

/** What a unit measures, in words, for a message about a wrong dimension. */
function dimensionWords(m: MathJsInstance, written: Unit): string {
  for (const kind of Object.keys(KIND_WORDS) as QuantityKind[]) {
    if (kind === 'pressurePerLength') continue; // the dimension of a unit weight: say that
    if (written.equalBase(systemUnit(m, kind, 'si'))) return KIND_WORDS[kind].noun;
  }
  if (written.equalBase(m.unit('kg/m^3'))) return 'a density (mass per volume; weight is mass × g)';
  if (written.equalBase(m.unit('kg'))) return 'a mass';
  if (written.equalBase(m.unit('m^2'))) return 'an area';
  if (written.equalBase(m.unit('m^3'))) return 'a volume';
  if (written.equalBase(m.unit('deg'))) return 'an angle';
  return `in ${written.formatUnits()}`;
}
