import { dateTimeText, WhenPipe } from './date-time';

describe('dateTimeText', () => {
  it("writes an ISO 8601 moment in the user's locale, with date and time", () => {
    const iso = '2026-12-02T09:40:00Z';
    const d = new Date(iso);
    expect(dateTimeText(iso)).toBe(
      d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }),
    );
    expect(new WhenPipe().transform(iso)).toBe(dateTimeText(iso));
    expect(dateTimeText(d)).toBe(dateTimeText(iso));
  });

  it('a dash for none; a text that is not a date as it is', () => {
    expect(dateTimeText(null)).toBe('—');
    expect(dateTimeText('soon')).toBe('soon');
  });
});
