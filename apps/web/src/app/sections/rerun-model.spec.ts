import {
  buildModel,
  buildPatch,
  keepCase,
  mayRemove,
  placeErrors,
  removeCase,
} from './rerun-model';
import type { LocatedError } from '../core/models';
import { sectionWithCases } from '../testing/rerun-case-fixtures';

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
