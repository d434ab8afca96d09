import { METHOD_NAMES, methodName } from './method-names';

describe('methodName', () => {
  it('names each method of the solver by its paper', () => {
    expect(methodName('bishop')).toBe("Bishop's simplified");
    expect(methodName('morgenstern-price')).toBe('Morgenstern–Price');
    expect(Object.keys(METHOD_NAMES)).toHaveLength(8);
  });

  it('gives an unknown id as it is, and a dash for none', () => {
    expect(methodName('sarma')).toBe('sarma');
    expect(methodName(null)).toBe('—');
    expect(methodName(undefined)).toBe('—');
    expect(methodName('')).toBe('—');
  });
});
