import { VERDICT_WORDS, VERDICTS } from '@scarpline/core/verdict';
import { capitalised, VERDICT_ICONS, verdictView } from './verdict';

describe('verdictView', () => {
  it('gives every verdict the core’s words and an icon of its own', () => {
    const icons = VERDICTS.map((v) => VERDICT_ICONS[v]);
    expect(new Set(icons).size).toBe(VERDICTS.length);
    for (const v of VERDICTS) {
      expect(verdictView(v)).toEqual({
        code: v,
        icon: VERDICT_ICONS[v],
        words: VERDICT_WORDS[v],
        short: expect.any(String),
      });
    }
    expect(verdictView('below').words).toBe('below the required FS');
    expect(capitalised(verdictView('meets').short)).toBe('Meets');
  });
});
