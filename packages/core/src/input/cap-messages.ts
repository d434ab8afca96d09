import { count, INPUT_LIMITS } from './limits';
import type { Message } from './types';

/**
 * At most `limit` of a list of messages (in the order of the file), errors before warnings
 * when not all can be kept, and then one message more that counts the others: its place is
 * the first message left out, its severity an error when an error was left out, and it
 * concerns every section that the messages left out concern. The message that a file was not
 * read to its end (code `not-read`) is always kept, last. A list within the limit comes back
 * as it is.
 *
 * @example capMessages(thirtyFiveThousand).length // → 201
 */
export function capMessages(
  messages: readonly Message[],
  limit: number = INPUT_LIMITS.messages,
): Message[] {
  if (messages.length <= limit) return [...messages];
  const notRead = messages.filter((m) => m.code === 'not-read');
  if (notRead.length > 0) {
    return [
      ...capMessages(
        messages.filter((m) => m.code !== 'not-read'),
        limit,
      ),
      ...notRead,
    ];
  }
  const errors = messages.filter((m) => m.severity === 'error').length;
  const keptErrors = Math.min(errors, limit);
  let errorsLeft = keptErrors;
  let warningsLeft = limit - keptErrors;
  const kept: Message[] = [];
  const left: Message[] = [];
  for (const m of messages) {
    if (m.severity === 'error' ? errorsLeft-- > 0 : warningsLeft-- > 0) kept.push(m);
    else left.push(m);
  }
  const leftErrors = left.filter((m) => m.severity === 'error').length;
  const leftWarnings = left.length - leftErrors;
  const words = [
    leftErrors > 0 ? `${count(leftErrors)} ${leftErrors === 1 ? 'error' : 'errors'}` : '',
    leftWarnings > 0 ? `${count(leftWarnings)} ${leftWarnings === 1 ? 'warning' : 'warnings'}` : '',
  ]
    .filter(Boolean)
    .join(' and ');
  const first = left[0];
  const sections = [...new Set(left.flatMap((m) => m.sections))];
  kept.push({
    severity: leftErrors > 0 ? 'error' : 'warning',
    file: first.file,
    line: first.line,
    column: first.column,
    path: '',
    code: 'more-messages',
    message: `${count(left.length)} more ${left.length === 1 ? 'message' : 'messages'} not shown (${words}), the first of them here: correct the ones above and read the file again`,
    sections,
  });
  return kept;
}
