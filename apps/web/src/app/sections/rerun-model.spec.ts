import {
  buildModel,
  buildPatch,
  keepCase,
  mayRemove,
  newStressPoint,
  placeErrors,
  removeCase,
} from './rerun-model';
import type { LocatedError } from '../core/models';
import { sectionWithCases } from '../testing/rerun-case-fixtures';
import { sectionWithStrengths } from '../testing/strength-fixtures';

/** A located error of a 422 as the API gives it (apps/api services/edits.ts). */
function located(path: string, message: string): LocatedError {
  return {
    severity: 'error',
    file: 'edited-section.json',
    line: 1,
    column: 1,
    path,
    code: 'below-minimum',
    message,
    sections: ['wfb-1150'],
  };
}

describe('the re-run model of a section with design cases', () => {
  it('gives each case its required FS; a seismic case kh, kv and its earthquake; a case its own materials only', () => {
    const m = buildModel(sectionWithCases());
    expect(m.cases.map((c) => [c.name, c.kind, c.requiredFs.shown])).toEqual([
      ['long term', 'long-term', 1.5],
      ['design flood, steady seepage', 'steady-seepage', 1.3],
      ['earthquake', 'seismic', 1.1],
    ]);
    expect(m.cases[0].sectionsRequirement).toBe(true);
    expect(m.cases[1].sectionsRequirement).toBe(false);
    expect(m.cases.map((c) => c.seismic !== null)).toEqual([false, false, true]);
    const quake = m.cases[2];
    expect(quake.earthquake?.map((f) => [f.key, f.shown, f.unit])).toEqual([
      ['pga', 0.2, 'g'],
      ['magnitude', 6, ''],
      // held in m, shown in mm as an SI file writes it
      ['allowableDisplacement', 150, 'mm'],
    ]);
    // the seepage case sets its own core; shell is the section's and the rigid base has nothing
    expect(m.cases.map((c) => c.materials.map((x) => x.name))).toEqual([[], ['core'], []]);
    expect(m.cases[1].materials[0].fields.map((f) => [f.path, f.shown])).toEqual([
      ['cases[1].materials.core.unitWeight', 19],
      ['cases[1].materials.core.saturatedUnitWeight', 20],
      ['cases[1].materials.core.strength.cohesion', 2],
      ['cases[1].materials.core.strength.frictionAngle', 24],
    ]);
  });

  it('has no case part for a section that lists no cases', () => {
    const input = sectionWithCases();
    delete input.cases;
    const m = buildModel(input);
    expect(m.cases).toEqual([]);
    expect(Object.keys(m.form.controls).some((k) => k.startsWith('case'))).toBe(false);
    m.requiredFs.control.setValue(1.4);
    expect(buildPatch(m)).toEqual({ requiredFs: 1.4 });
  });

  it('sends only what changed, by case name; kv goes with kh; a displacement in mm', () => {
    const m = buildModel(sectionWithCases());
    expect(buildPatch(m)).toEqual({});
    const [, seepage, quake] = m.cases;
    seepage.requiredFs.control.setValue(1.4);
    seepage.materials[0].fields[3].control.setValue(22);
    quake.seismic!.kh.control.setValue(0.15);
    quake.earthquake![2].control.setValue(100);
    expect(buildPatch(m)).toEqual({
      cases: {
        'design flood, steady seepage': {
          requiredFs: 1.4,
          materials: { core: { strength: { frictionAngle: 22 } } },
        },
        earthquake: { seismic: { kh: 0.15, kv: 0.02 }, earthquake: { allowableDisplacement: 100 } },
      },
    });
  });

  it('sends a cleared earthquake value as null (removed)', () => {
    const m = buildModel(sectionWithCases());
    m.cases[2].earthquake![1].control.setValue(null);
    expect(m.cases[2].group.valid).toBe(true);
    expect(buildPatch(m)).toEqual({ cases: { earthquake: { earthquake: { magnitude: null } } } });
  });

  it('checks the ranges of the schema: kh in [0, 1), kv in (−1, 1), pga in (0, 3], required FS > 0', () => {
    const q = buildModel(sectionWithCases()).cases[2];
    const err = (v: number | null, f: typeof q.requiredFs) => {
      f.control.setValue(v);
      return f.control.errors;
    };
    expect(err(1, q.seismic!.kh)).toEqual({ range: 'kh must be at least 0 and less than 1.' });
    expect(err(0, q.seismic!.kh)).toBeNull();
    expect(err(-1, q.seismic!.kv)).toEqual({
      range: 'kv must be greater than -1 and less than 1.',
    });
    expect(err(-0.5, q.seismic!.kv)).toBeNull();
    expect(err(3.5, q.earthquake![0])).toEqual({
      range: 'The design PGA must be greater than 0 g and at most 3 g.',
    });
    expect(err(0, q.earthquake![2])).toEqual({
      range: 'The allowable displacement must be greater than 0 mm.',
    });
    expect(err(0, q.requiredFs)).toEqual({ range: 'The required FS must be greater than 0.' });
    expect(err(null, q.requiredFs)).toEqual({ required: 'Give the required FS.' });
  });

  it('removes a case by name, never the last one, and keeps one again when asked', () => {
    const m = buildModel(sectionWithCases());
    const [longTerm, seepage, quake] = m.cases;
    quake.requiredFs.control.setValue(-1); // out of range, but the case goes
    removeCase(m, quake);
    removeCase(m, longTerm);
    expect(m.form.valid).toBe(true);
    expect(mayRemove(m, seepage)).toBe(false);
    removeCase(m, seepage);
    expect(seepage.removed()).toBe(false);
    expect(buildPatch(m)).toEqual({ cases: { 'long term': null, earthquake: null } });
    keepCase(longTerm);
    expect(mayRemove(m, seepage)).toBe(true);
    expect(buildPatch(m)).toEqual({ cases: { earthquake: null } });
  });

  it('puts the errors of a case on its field, counting the cases in the list as edited', () => {
    const m = buildModel(sectionWithCases());
    const [longTerm, seepage, quake] = m.cases;
    removeCase(m, longTerm);
    const rest = placeErrors(m, [
      // the API's paths are in the edited list: the earthquake is its second case now
      located('cases[1].seismic.kh', '-0.1 is below 0'),
      located('cases[0].materials.core.strength.cohesion', '-2 is below 0 kPa'),
      located('cases[1].drawdown', 'only a rapid-drawdown case gives drawdown'),
    ]);
    expect(quake.seismic!.kh.control.errors).toEqual({ server: '-0.1 is below 0' });
    expect(seepage.materials[0].fields[2].control.errors).toEqual({ server: '-2 is below 0 kPa' });
    expect(longTerm.requiredFs.control.errors).toBeNull();
    expect(rest.map((e) => e.path)).toEqual(['cases[1].drawdown']);
  });
});

describe('the re-run model of the strengths that vary with stress', () => {
  const byName = (m: ReturnType<typeof buildModel>, name: string) =>
    m.materials.find((x) => x.name === name)!;
  const strengthFields = (m: ReturnType<typeof buildModel>, name: string) =>
    byName(m, name)
      .fields.filter((f) => f.at[0] === 'strength')
      .map((f) => [f.label, f.unit, f.shown, f.path]);

  it("offers each model's own fields, with their units and paths", () => {
    const m = buildModel(sectionWithStrengths());
    expect(strengthFields(m, 'mudstone')).toEqual([
      ['σci', 'kPa', 15000, 'materials.mudstone.strength.intactStrength'],
      ['GSI', '', 35, 'materials.mudstone.strength.gsi'],
      ['mi', '', 8, 'materials.mudstone.strength.mi'],
      ['D', '', 0.7, 'materials.mudstone.strength.disturbance'],
    ]);
    // OCR when the section gives a constant one, POP when it gives that: never both
    expect(strengthFields(m, 'soft-clay')).toEqual([
      ['S = Su/σ′v', '', 0.22, 'materials.soft-clay.strength.ratio'],
      ['m (exponent of OCR)', '', 0.8, 'materials.soft-clay.strength.exponent'],
      ['OCR', '', 1.5, 'materials.soft-clay.strength.ocr'],
      ['Least Su', 'kPa', 8, 'materials.soft-clay.strength.minimum'],
    ]);
    expect(strengthFields(m, 'crust-clay').map((f) => f[0])).toEqual([
      'S = Su/σ′v',
      'm (exponent of OCR)',
      'POP',
      'Least Su',
    ]);
    expect(byName(m, 'crust-clay').fields.find((f) => f.key === 'pop')?.unit).toBe('kPa');
    expect(strengthFields(m, 'fill')).toEqual([
      ['c′', 'kPa', 3, 'materials.fill.strength.cohesion'],
      ['φ′1', '°', 38, 'materials.fill.strength.frictionAngle'],
      ['Break stress σ′n', 'kPa', 150, 'materials.fill.strength.breakStress'],
      ['φ′2', '°', 32, 'materials.fill.strength.frictionAngleBeyond'],
    ]);
    // the shear–normal points as a list (shown to six digits); no single-number field
    const rockfill = byName(m, 'rockfill');
    expect(strengthFields(m, 'rockfill')).toEqual([]);
    expect(rockfill.points?.path).toBe('materials.rockfill.strength.points');
    expect(rockfill.points?.array.getRawValue()).toEqual([
      { x: 0, y: 0 },
      { x: 100, y: 95 },
      { x: 400, y: 300.123 },
    ]);
    expect(byName(m, 'mudstone').points).toBeNull();
    expect(m.form.valid).toBe(true);
    expect(buildPatch(m)).toEqual({});
  });

  it('checks the ranges of the schema for Hoek–Brown, Su from σ′v and the bilinear envelope', () => {
    const m = buildModel(sectionWithStrengths());
    const err = (name: string, key: string, v: number | null) => {
      const f = byName(m, name).fields.find((x) => x.key === key)!;
      f.control.setValue(v);
      const e = f.control.errors;
      f.control.setValue(f.shown);
      return e;
    };
    expect(err('mudstone', 'intactStrength', 0)).toEqual({
      range: 'σci must be greater than 0 kPa.',
    });
    expect(err('mudstone', 'gsi', 100)).toBeNull();
    expect(err('mudstone', 'gsi', 101)).toEqual({
      range: 'GSI must be greater than 0 and at most 100.',
    });
    expect(err('mudstone', 'mi', 51)).toEqual({
      range: 'mi must be greater than 0 and at most 50.',
    });
    expect(err('mudstone', 'disturbance', 1.2)).toEqual({
      range: 'D must be at least 0 and at most 1.',
    });
    expect(err('mudstone', 'disturbance', null)).toEqual({ required: 'Give D.' });
    expect(err('soft-clay', 'ratio', 0)).toEqual({ range: 'S must be greater than 0.' });
    expect(err('soft-clay', 'exponent', 1.6)).toEqual({
      range: 'm must be at least 0 and at most 1.5.',
    });
    expect(err('soft-clay', 'ocr', 0.9)).toEqual({ range: 'OCR must be at least 1.' });
    expect(err('crust-clay', 'pop', -5)).toEqual({ range: 'POP must be at least 0 kPa.' });
    expect(err('soft-clay', 'minimum', -1)).toEqual({
      range: 'The least Su must be at least 0 kPa.',
    });
    expect(err('fill', 'breakStress', 0)).toEqual({
      range: 'The break stress must be greater than 0 kPa.',
    });
    expect(err('fill', 'frictionAngleBeyond', 90)).toEqual({
      range: 'φ′2 must be at least 0° and less than 90°.',
    });
    expect(m.form.valid).toBe(true);
  });

  it('checks the points as the schema and the core do: two at least, σ′n increasing, τ ≥ 0', () => {
    const m = buildModel(sectionWithStrengths());
    const pts = byName(m, 'rockfill').points!.array;
    pts.at(2).controls.x.setValue(100);
    expect(pts.errors).toEqual({
      order:
        'Point 3: σ′n 100 kPa is not above that of the point before (100 kPa); give the points with σ′n increasing.',
    });
    expect(m.form.valid).toBe(false);
    pts.at(2).controls.x.setValue(400);
    pts.at(1).controls.y.setValue(-1);
    expect(pts.at(1).controls.y.errors).toEqual({ range: 'τ must be at least 0 kPa.' });
    pts.at(1).controls.y.setValue(95);
    pts.removeAt(2);
    pts.removeAt(1);
    expect(pts.errors).toEqual({
      points: 'A shear–normal strength needs at least two points (σ′n, τ).',
    });
    pts.push(newStressPoint(null));
    expect(pts.errors).toBeNull();
    expect(pts.at(1).controls.x.errors).toEqual({ required: 'Give σ′n.' });
  });

  it('sends each model by its own fields; the points whole, a point left alone exact', () => {
    const m = buildModel(sectionWithStrengths());
    const set = (name: string, key: string, v: number) =>
      byName(m, name)
        .fields.find((x) => x.key === key)!
        .control.setValue(v);
    set('mudstone', 'gsi', 40);
    set('mudstone', 'disturbance', 0.5);
    set('soft-clay', 'ocr', 2);
    set('crust-clay', 'pop', 40);
    set('fill', 'breakStress', 200);
    const pts = byName(m, 'rockfill').points!.array;
    pts.at(1).controls.y.setValue(90);
    pts.push(newStressPoint([600, 420]));
    expect(buildPatch(m)).toEqual({
      materials: {
        mudstone: { strength: { gsi: 40, disturbance: 0.5 } },
        'soft-clay': { strength: { ocr: 2 } },
        'crust-clay': { strength: { pop: 40 } },
        rockfill: {
          strength: {
            points: [
              [0, 0],
              [100, 90],
              [400, 300.123456789],
              [600, 420],
            ],
          },
        },
        fill: { strength: { breakStress: 200 } },
      },
    });
  });

  it("sends a case's own points by the case's name, and places the API's errors on a point", () => {
    const m = buildModel(sectionWithStrengths());
    const loose = m.cases[1];
    expect(loose.materials.map((x) => x.name)).toEqual(['rockfill']);
    const pts = loose.materials[0].points!;
    expect(pts.path).toBe('cases[1].materials.rockfill.strength.points');
    pts.array.at(1).controls.x.setValue(150);
    expect(buildPatch(m)).toEqual({
      cases: {
        'loose rockfill': {
          materials: {
            rockfill: {
              strength: {
                points: [
                  [0, 0],
                  [150, 80],
                ],
              },
            },
          },
        },
      },
    });
    const sectionPts = byName(m, 'rockfill').points!.array;
    const rest = placeErrors(m, [
      located(
        'materials.rockfill.strength.points[2]',
        'σn 90 is not above that of the point before',
      ),
      located('materials.rockfill.strength.points[1][1]', '-3 is below 0'),
      located('materials.rockfill.strength.points', 'give at least two points'),
      located('materials.mudstone.strength.gsi', '0 is not above 0'),
      // the API's paths count the cases as edited: none removed here
      located('cases[1].materials.rockfill.strength.points[0][0]', 'not a number'),
    ]);
    expect(rest).toEqual([]);
    expect(sectionPts.at(2).controls.x.errors).toEqual({
      server: 'σn 90 is not above that of the point before',
    });
    expect(sectionPts.at(1).controls.y.errors).toEqual({ server: '-3 is below 0' });
    expect(sectionPts.errors).toEqual({ server: 'give at least two points' });
    expect(byName(m, 'mudstone').fields.find((f) => f.key === 'gsi')!.control.errors).toEqual({
      server: '0 is not above 0',
    });
    expect(pts.array.at(0).controls.x.errors).toEqual({ server: 'not a number' });
  });
});
