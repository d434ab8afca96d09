import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * poppler-utils (pdftotext, pdffonts, pdfimages) from Debian: installed when missing and root
 * may (as in CI); otherwise the error says why, so that the checks fail rather than skip.
 */
export function requirePoppler(): void {
  const runs = () => spawnSync('pdftotext', ['-v']).status === 0;
  if (runs()) return;
  if (process.getuid?.() !== 0 || spawnSync('apt-get', ['--version']).status !== 0)
    throw new Error(
      'pdftotext is not installed and apt-get cannot install it here: install poppler-utils',
    );
  const apt = (args: string[]) =>
    spawnSync('apt-get', args, {
      timeout: 240_000,
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    }).status === 0;
  const install = ['install', '-y', '--no-install-recommends', 'poppler-utils'];
  if (!apt(install) && !(apt(['update']) && apt(install)))
    throw new Error("apt-get could not install poppler-utils (Debian's registry unreachable?)");
  if (!runs()) throw new Error('poppler-utils installed but pdftotext does not run');
}

/** Writes the PDF to a temporary file and returns its path. */
export function pdfFile(pdf: Buffer, name = 'report.pdf'): string {
  const path = join(mkdtempSync(join(tmpdir(), 'scarpline-pdf-')), name);
  writeFileSync(path, pdf);
  return path;
}

function tool(cmd: string, args: string[]): string {
  const r = spawnSync(cmd, args, { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')}: ${r.stderr}`);
  return r.stdout;
}

/** The text of each page (pdftotext; `-layout` keeps the columns of a line together). */
export function pageTexts(path: string, layout = true): string[] {
  const text = tool('pdftotext', [...(layout ? ['-layout'] : []), path, '-']);
  const pages = text.split('\f');
  return pages[pages.length - 1].trim() === '' ? pages.slice(0, -1) : pages;
}

/** pdffonts' rows: the font's name and whether it is embedded. */
export function fonts(path: string): { name: string; embedded: boolean }[] {
  return tool('pdffonts', [path])
    .split('\n')
    .slice(2)
    .filter((l) => l.trim())
    .map((l) => {
      const cols = l.trim().split(/\s+/);
      // name, type words…, encoding, emb, sub, uni, object, id
      return { name: cols[0], embedded: cols[cols.length - 5] === 'yes' };
    });
}

/** The images of the file (pdfimages -list, after its two header lines). */
export function images(path: string): string[] {
  return tool('pdfimages', ['-list', path])
    .split('\n')
    .slice(2)
    .filter((l) => l.trim());
}

/** Text with every run of white space one space. */
export const flat = (s: string): string => s.replace(/\s+/g, ' ').trim();
