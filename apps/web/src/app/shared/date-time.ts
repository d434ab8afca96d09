import { Pipe, type PipeTransform } from '@angular/core';

/**
 * The one way the web app writes a moment: a date and time in the user's own locale (the
 * browser's), e.g. "2 Dec 2026, 09:40" or "Dec 2, 2026, 9:40 AM"; the API and every file give
 * ISO 8601. A dash for none; a text that is not a date as it is.
 *
 * @example dateTimeText('2026-12-02T09:40:00Z') // → '2 Dec 2026, 09:40' (en-GB)
 */
export function dateTimeText(iso: string | Date | null | undefined): string {
  if (!iso) return '—';
  const d = iso instanceof Date ? iso : new Date(iso);
  return Number.isNaN(d.getTime())
    ? String(iso)
    : d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** `{{ value | when }}`: dateTimeText in a template. */
@Pipe({ name: 'when' })
export class WhenPipe implements PipeTransform {
  transform(iso: string | Date | null | undefined): string {
    return dateTimeText(iso);
  }
}
