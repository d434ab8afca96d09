/**
 * Words broken into lines of at most `width` characters (a word longer than that stands on
 * a line of its own).
 *
 * @example wrapText('Results are for review by a qualified engineer.', 20)
 * // → ['Results are for', 'review by a', 'qualified engineer.']
 */
export function wrapText(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}
