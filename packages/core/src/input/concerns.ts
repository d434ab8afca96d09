import { capMessages } from './cap-messages';
import type { Message, SectionEntry } from './types';

/**
 * Which entries (sections of an input) each message concerns, noted while the input is read
 * and put together at the end: every message gets the ids of its sections, every entry its
 * messages. A message never noted concerns every entry of the file (a syntax error, an empty
 * file); one noted with no entries concerns none.
 */
export class Concerns {
  private readonly about = new Map<Message, Set<number>>();

  /** Notes that a message concerns these entries (by index). */
  note(message: Message, entries: Iterable<number> = []): void {
    const set = this.about.get(message) ?? new Set<number>();
    for (const i of entries) set.add(i);
    this.about.set(message, set);
  }

  /** The entries a message was noted for. */
  of(message: Message): number[] {
    return [...(this.about.get(message) ?? [])];
  }

  /**
   * Fills `sections` of every message and `messages` of every entry, in the order of
   * `messages`.
   */
  resolve(messages: readonly Message[], entries: SectionEntry[]): void {
    const all = entries.map((_, i) => i);
    for (const m of messages) {
      const concerned = this.about.has(m) ? this.of(m).sort((a, b) => a - b) : all;
      const ids = new Set<string>();
      for (const i of concerned) {
        const e = entries[i];
        if (e.id !== null) ids.add(e.id);
        e.messages.push(m);
      }
      m.sections = [...ids];
    }
  }

  /**
   * The messages of an input read from several files (a corridor and its header) settled: in
   * order of file and place, given to the entries they concern (resolve), and each list capped
   * (capMessages). Returns the input's own list.
   */
  settle(messages: Message[], entries: SectionEntry[]): Message[] {
    messages.sort((a, b) =>
      a.file === b.file ? a.line - b.line || a.column - b.column : a.file < b.file ? -1 : 1,
    );
    this.resolve(messages, entries);
    for (const e of entries) e.messages = capMessages(e.messages);
    return capMessages(messages);
  }
}
