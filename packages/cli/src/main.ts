#!/usr/bin/env node
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Command } from 'commander';
import { analyzeFiles } from './analyze-files';
import { validateFiles } from './validate-files';

const { version } = JSON.parse(readFileSync(join(__dirname, '..', 'package.json'), 'utf8')) as {
  version: string;
};

const program = new Command();
program
  .name('scarpline')
  .description('Slope-stability analysis of cross-sections along road, rail and levee corridors.')
  .version(version, '-V, --version', 'print the version');

program
  .command('validate')
  .description('check section and batch files (YAML or JSON) and print located messages')
  .argument('<file...>', 'section or batch files; a directory means every .yaml/.yml/.json in it')
  .addHelpText(
    'after',
    `
Example:
  $ scarpline validate examples/cut-homogeneous.yaml examples/corridor

Exit status: 0 when every file is valid, 1 otherwise.`,
  )
  .action((files: string[]) => {
    process.exitCode = validateFiles(files, (line) => console.log(line));
  });

program
  .command('analyze')
  .description('analyse section files: factor of safety per method, governing FS, warnings')
  .argument(
    '<file...>',
    'section or batch files (YAML or JSON); a directory means every file in it',
  )
  .option('--json', 'print the result contract as JSON')
  .addHelpText(
    'after',
    `
Example:
  $ scarpline analyze examples/cut-homogeneous.yaml
  $ scarpline analyze examples/levee-river-side.yaml --json > levee.json

Exit status: 0 when every section passes its required FS, 2 when one is below it,
1 when a file is invalid.`,
  )
  .action((files: string[], opts: { json?: boolean }) => {
    process.exitCode = analyzeFiles(
      files,
      opts,
      (line) => console.log(line),
      (line) => console.error(line),
    );
  });

program.addHelpText(
  'after',
  `
Examples:
  $ scarpline validate examples/*
  $ scarpline analyze examples/cut-homogeneous.yaml`,
);

program.parseAsync(process.argv).catch((e: unknown) => {
  console.error(`scarpline: ${e instanceof Error ? e.message : String(e)}`);
  process.exitCode = 1;
});
