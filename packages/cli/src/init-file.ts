import { existsSync, writeFileSync } from 'node:fs';
import { UserError } from './read-input';
import { cut } from './starters/cut';
import { embankment } from './starters/embankment';
import { levee } from './starters/levee';
import { nailedCut } from './starters/nailed-cut';
import { reinforcedEmbankment } from './starters/reinforced-embankment';
import { rockCut } from './starters/rock-cut';
import { sandFill } from './starters/sand-fill';

/** The starter files `scarpline init --kind` writes. */
export const STARTERS = {
  cut,
  embankment,
  levee,
  'sand-fill': sandFill,
  'rock-cut': rockCut,
  'reinforced-embankment': reinforcedEmbankment,
  'nailed-cut': nailedCut,
} as const;
export type StarterKind = keyof typeof STARTERS;

/**
 * `scarpline init`: writes a commented starter section file of the given kind to `file`
 * (default `<kind>.yaml`; `-` prints it), never over an existing file unless `force`.
 *
 * @example initFile('cut', 'my-cut.yaml', false, console.log) // → writes my-cut.yaml
 */
export function initFile(
  kind: string,
  file: string | undefined,
  force: boolean,
  out: (text: string) => void,
): number {
  if (!(kind in STARTERS))
    throw new UserError(
      `--kind: ${JSON.stringify(kind)} is not a starter; use ${Object.keys(STARTERS).join(', ')}`,
    );
  const text = STARTERS[kind as StarterKind];
  const path = file ?? `${kind}.yaml`;
  if (path === '-') {
    out(text.replace(/\n$/, ''));
    return 0;
  }
  if (existsSync(path) && !force)
    throw new UserError(`${path} exists; give another name or --force to replace it`);
  writeFileSync(path, text);
  out(`wrote ${path}: a ${kind} starter; edit it, then: scarpline analyze ${path}`);
  return 0;
}
