import { readFileSync } from 'node:fs';
import {
  formatMessage,
  isGeoJsonCorridor,
  isLandXml,
  parseGeoJsonCorridor,
  parseLandXmlCorridor,
  parseSections,
  type HeaderFile,
} from '@scarpline/core';
import { collectFiles } from './collect-files';
import { readInput, UserError } from './read-input';

const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

/**
 * `scarpline validate`: reads each file (every section file under a directory), prints its
 * located errors and warnings and a one-line summary, and returns the exit code: 0 when every
 * file is valid, 1 otherwise. A GeoJSON or LandXML corridor is read as `batch` reads it, with
 * the corridor settings of `template` when given; a terrain job is cut, and the corridor cut
 * from it validated.
 *
 * @example await validateFiles(['examples'], console.log) // → 0
 */
export async function validateFiles(
  paths: readonly string[],
  print: (line: string) => void,
  template?: string,
): Promise<number> {
  let header: HeaderFile | undefined;
  if (template) {
    const t = readInput(template);
    header = { text: t.text, fileName: t.name };
  }
  const { files, missing } = collectFiles(paths);
  let failed = missing.length;
  for (const path of missing) print(`${path}: no such file or directory`);
  if (files.length === 0 && missing.length === 0) {
    print('no .yaml, .yml or .json files found');
    return 1;
  }
  for (const file of files) {
    let text: string;
    try {
      text = readFileSync(file, 'utf8');
    } catch (e) {
      const reason = e instanceof Error && 'code' in e ? String(e.code) : 'unreadable';
      print(`${file}: cannot read the file (${reason})`);
      failed++;
      continue;
    }
    let parsed;
    if (/scarpline-terrain\//.test(text.slice(0, 4000))) {
      // a terrain job: the corridor cut from it (its own messages printed as they come)
      const { terrainBatchInput } = await import('./cut-terrain');
      let cut;
      try {
        cut = await terrainBatchInput(file, print);
      } catch (e) {
        if (!(e instanceof UserError)) throw e;
        print(`${file}: invalid: ${e.message}`);
        failed++;
        continue;
      }
      parsed = cut ? parseGeoJsonCorridor(cut.text, cut.name) : parseSections(text, file);
    } else if (isLandXml(text)) parsed = parseLandXmlCorridor(text, file, header);
    else if (isGeoJsonCorridor(text)) parsed = parseGeoJsonCorridor(text, file, header);
    else parsed = parseSections(text, file);
    const { sections } = parsed;
    // A corridor batch without its sections is the settings of a GeoJSON or LandXML corridor
    // (--template): checked against the schema like any batch, all but the sections it leaves out.
    const settings =
      parsed.batch !== null &&
      parsed.messages.some((m) => m.code === 'missing' && m.message === 'sections is missing');
    const messages = settings
      ? parsed.messages.filter(
          (m) => !(m.code === 'missing' && m.message === 'sections is missing'),
        )
      : parsed.messages;
    for (const m of messages) print(formatMessage(m));
    const errors = messages.filter((m) => m.severity === 'error').length;
    const warnings = messages.length - errors;
    const tail = warnings ? `, ${plural(warnings, 'warning')}` : '';
    if (errors) {
      failed++;
      print(`${file}: invalid: ${plural(errors, 'error')}${tail}`);
    } else if (settings)
      print(
        `${file}: valid: corridor settings (give them with a GeoJSON or LandXML corridor: --template)${tail}`,
      );
    else print(`${file}: valid: ${plural(sections.length, 'section')}${tail}`);
  }
  return failed === 0 ? 0 : 1;
}
