import { errorPath, fieldOf, requestText, type StudyError } from './study-model';

const at = (where: Partial<StudyError>): StudyError => ({
  severity: 'error',
  code: 'x',
  message: 'm',
  path: '',
  sections: [],
  ...where,
});

describe('where a study’s error belongs', () => {
  it('reads a JSON pointer (RFC 6901, ~1 and ~0 escaped) and a dotted path alike', () => {
    expect(errorPath(at({ pointer: '/probability/variables/0/target' }))).toBe(
      'probability.variables.0.target',
    );
    expect(errorPath(at({ path: '/range/1' }))).toBe('range.1');
    expect(errorPath(at({ path: 'probability.variables[2].sd' }))).toBe(
      'probability.variables.2.sd',
    );
    expect(errorPath(at({ pointer: '/target/a~1b~0c' }))).toBe('target.a/b~c');
  });

  it('names the field of the form, or none', () => {
    expect(fieldOf(at({ pointer: '/probability/realisations' }))).toBe('realisations');
    expect(fieldOf(at({ pointer: '/probability/seed' }))).toBe('seed');
    expect(fieldOf(at({ pointer: '/probability' }))).toBe('variables');
    expect(fieldOf(at({ path: 'probability.correlations[0].coefficient' }))).toBe('variables');
    expect(fieldOf(at({ pointer: '/range/0' }))).toBe('from');
    expect(fieldOf(at({ pointer: '/range' }))).toBe('from');
    expect(fieldOf(at({ pointer: '/range/1' }))).toBe('to');
    expect(fieldOf(at({ path: 'targetFs' }))).toBe('targetFs');
    expect(fieldOf(at({ path: 'case' }))).toBe('case');
    expect(fieldOf(at({ path: '' }))).toBeNull();
    expect(fieldOf(at({ path: 'section' }))).toBeNull();
  });
});

describe('requestText', () => {
  it('says a sensitivity’s and a solve’s request in one line', () => {
    expect(requestText({ kind: 'sensitivity' })).toBe('every case');
    expect(requestText({ kind: 'sensitivity', case: 'long term' })).toBe('case long term');
    expect(
      requestText({
        kind: 'solve',
        target: 'water.level',
        range: [-2, 1],
        case: 'design flood',
      }),
    ).toBe('water.level for the required FS between -2 and 1, case design flood');
    expect(requestText({ kind: 'probability' })).toBe('the section’s own variables and settings');
  });
});
