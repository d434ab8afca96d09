import { userName } from './user-name';

describe('userName', () => {
  const evan = { id: 2, name: 'Evan Engineer' };

  it('marks the signed-in user', () => {
    expect(userName(evan, 2)).toBe('Evan Engineer (you)');
  });

  it('gives another user, or anyone when nobody is signed in, by name alone', () => {
    expect(userName(evan, 3)).toBe('Evan Engineer');
    expect(userName(evan, null)).toBe('Evan Engineer');
    expect(userName(evan, undefined)).toBe('Evan Engineer');
  });
});
