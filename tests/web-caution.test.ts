/**
 * The web app shows the solver's caution on every result page. The app does not bundle the
 * solver, so it carries the words itself; this keeps them the same as the core's CAUTION.
 */
import fs from 'node:fs';
import path from 'node:path';
import { CAUTION } from '@scarpline/core';

test("the web app's caution is the solver's, word for word", () => {
  const source = fs.readFileSync(
    path.join(__dirname, '../apps/web/src/app/shared/caution.ts'),
    'utf8',
  );
  const m = /export const CAUTION_TEXT =\s*'([^']+)'/.exec(source);
  expect(m).not.toBeNull();
  expect(m![1]).toBe(CAUTION);
});
