#!/usr/bin/env node
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Command, Option } from 'commander';
import type { UnitSystem } from '@scarpline/core';
import { initFile, STARTERS } from './init-file';
import type { Appendix } from './report-file';
import { UserError } from './read-input';

// Start-up: this module loads only commander and the starter files (text). Each other command
// loads what it needs when it runs (`import()` compiles to a require at that point), so that
// `scarpline --version`, `--help` and `init` never load the solver, the YAML parser or ajv.

const { version } = JSON.parse(readFileSync(join(__dirname, '..', 'package.json'), 'utf8')) as {
  version: string;
};

const EXIT = `
Exit status: 0 when every section meets its required FS, 2 when at least one is below it,
1 when an input is invalid or a section has no factor of safety (no method converged).`;

const collect = (v: string, all: string[] = []) => [...all, v];

const print = (line: string) => console.log(line);
const printErr = (line: string) => console.error(line);

/** The options that replace the file's analysis settings. */
function withOverrides(cmd: Command): Command {
  return cmd
    .option(
      '-m, --method <ids>',
      "methods to run instead of the file's (comma list or repeated): ordinary, bishop, janbu, spencer, morgenstern-price, phi-zero-circle, log-spiral, infinite-slope",
      collect,
    )
    .option('--slices <n>', "number of slices instead of the file's")
    .option('--required-fs <fs>', "required factor of safety instead of the file's");
}

const units = () =>
  new Option(
    '--units <system>',
    'units of the output: si (m, kN/m, kPa) or us (ft, lbf/ft, psf)',
  ).choices(['si', 'us']);

const program = new Command();
program
  .name('scarpline')
  .description('Slope-stability analysis of cross-sections along road, rail and levee corridors.')
  .version(version, '-V, --version', 'print the version')
  .showHelpAfterError('(add --help for the options and an example)');

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
  .action(async (files: string[]) => {
    const { validateFiles } = await import('./validate-files');
    process.exitCode = await validateFiles(files, print);
  });

withOverrides(
  program
    .command('analyze')
    .description(
      'analyze section files: factor of safety per method, governing FS against the required FS, warnings',
    )
    .argument(
      '<file...>',
      'section or batch files (YAML or JSON); a directory means every file in it; - reads standard input',
    ),
)
  .option('--json', 'print the result contract as JSON: { caution, sections }')
  .option('--csv', 'print CSV: a row per section and method')
  .option(
    '--slice-table',
    "end each case's table with its governing method's slices: geometry, forces, the strength each base took and the stress it was taken at",
  )
  .addOption(units())
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline analyze examples/cut-homogeneous.yaml
  $ scarpline analyze examples/levee-land-side.yaml --json > levee.json
  $ scarpline analyze examples/*.yaml --csv --method bishop,spencer --slices 60
  $ scarpline analyze examples/cut-rock-hoek-brown.yaml --slice-table
  $ cat section.yaml | scarpline analyze - --units us
${EXIT}`,
  )
  .action(
    async (
      files: string[],
      opts: {
        json?: boolean;
        csv?: boolean;
        sliceTable?: boolean;
        units?: UnitSystem;
        method?: string[];
        slices?: string;
        requiredFs?: string;
      },
    ) => {
      if (opts.json && opts.csv) throw new UserError('give --json or --csv, not both');
      if (opts.sliceTable && (opts.json || opts.csv))
        throw new UserError('--slice-table is for the table: --json and --csv hold every slice');
      const { checkOverrides } = await import('./overrides');
      const { analyzeFiles } = await import('./analyze-files');
      process.exitCode = analyzeFiles(
        files,
        {
          json: opts.json,
          csv: opts.csv,
          sliceTable: opts.sliceTable,
          units: opts.units,
          ...checkOverrides(opts),
        },
        print,
        printErr,
      );
    },
  );

withOverrides(
  program
    .command('batch')
    .description(
      'analyze a corridor (a batch file, or a GeoJSON FeatureCollection of section lines) on every core',
    )
    .argument(
      '<corridor>',
      'a batch file (format scarpline-batch/1, JSON or YAML), a GeoJSON corridor, or a terrain job (format scarpline-terrain/1: the sections are cut first, see `scarpline cut`)',
    ),
)
  .option(
    '-o, --out <dir>',
    'write results.json, results.csv, results.geojson, results.xlsx, chainage.svg and sections/<id>.svg there',
  )
  .option(
    '--slice-sheets',
    "results.xlsx: add a sheet per section with the slice table of each case's governing method",
  )
  .option('-j, --jobs <n>', 'worker threads (default: one per core)')
  .option(
    '-t, --template <file>',
    'GeoJSON corridor: the corridor settings (id, units, template) from this file instead of the collection\'s "scarpline" member',
  )
  .option('--no-svg', 'do not draw a section SVG per station')
  .addOption(
    new Option(
      '--report [appendix]',
      'also write the corridor report (PDF) into --out, with the section pages of every station, of those below requirement, or none',
    ).choices(['all', 'below', 'none']),
  )
  .option('--project <name>', 'the project named in the report')
  .option('--by <name>', 'who submits the report')
  .addOption(units())
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline batch examples/corridor/corridor.json --out results/
  $ scarpline batch sections.geojson --template corridor-settings.yaml --out results/ --jobs 4
  $ scarpline batch examples/corridor/corridor.json --out results/ --report below --by "J. Marsh"
  $ scarpline batch examples/terrain/wendlecombe.terrain.yaml --out results/

A terminal gets a progress bar; otherwise a line per section goes to standard error.
Ctrl-C stops the workers and closes the files with the sections finished so far.
${EXIT}
130 when interrupted.`,
  )
  .action(
    async (
      file: string,
      opts: {
        out?: string;
        jobs?: string;
        template?: string;
        svg?: boolean;
        sliceSheets?: boolean;
        report?: true | Appendix;
        project?: string;
        by?: string;
        units?: UnitSystem;
        method?: string[];
        slices?: string;
        requiredFs?: string;
      },
    ) => {
      if (opts.sliceSheets && !opts.out)
        throw new UserError('--slice-sheets is for results.xlsx: give --out <dir>');
      if (opts.report && !opts.out)
        throw new UserError(
          '--report writes the corridor report into the output folder: give --out <dir>',
        );
      const jobs = opts.jobs === undefined ? undefined : Number(opts.jobs);
      if (jobs !== undefined && (!Number.isInteger(jobs) || jobs < 1))
        throw new UserError(`--jobs: ${opts.jobs} is not a whole number of 1 or more`);
      const { checkOverrides } = await import('./overrides');
      const { runBatch } = await import('./batch/run-batch');
      // a terrain job: the corridor cut from it
      const { terrainBatchInput } = await import('./cut-terrain');
      const terrain = await terrainBatchInput(file, printErr);
      process.exitCode = await runBatch(
        file,
        {
          ...(terrain ? { input: terrain } : {}),
          out: opts.out,
          ...(opts.report && opts.out
            ? {
                report: {
                  appendix: opts.report === true ? 'below' : opts.report,
                  project: opts.project,
                  by: opts.by,
                },
              }
            : {}),
          template: opts.template,
          svg: opts.svg,
          sliceSheets: opts.sliceSheets === true,
          units: opts.units,
          ...checkOverrides(opts),
          jobs,
          tty: process.stderr.isTTY === true,
        },
        print,
        printErr,
      );
    },
  );

// --- sections cut from terrain
program
  .command('cut')
  .description(
    'cut cross-sections from a terrain raster (GeoTIFF) along an alignment and write them as a GeoJSON corridor',
  )
  .argument(
    '[job]',
    'a terrain job file (format scarpline-terrain/1, YAML or JSON); the options replace its settings',
  )
  .option('--terrain <tif>', 'the ground: a GeoTIFF elevation raster, north-up, projected')
  .option('--alignment <geojson>', "the alignment: a GeoJSON LineString in the raster's system")
  .option('--start <chainage>', 'chainage at the first position of the alignment (default 0)')
  .option('--every <interval>', 'a station every INTERVAL along the alignment')
  .option('--from <chainage>', 'with --every: the first station (default: the start)')
  .option('--to <chainage>', 'with --every: the last station at most (default: the end)')
  .option('--stations <list>', 'the stations as a comma list, e.g. 1000,1050,1125')
  .option('--left <width>', 'half-width of each section left of the alignment (m or ft)')
  .option('--right <width>', 'half-width of each section right of the alignment (m or ft)')
  .option('--spacing <length>', 'distance between samples along a section')
  .option(
    '-t, --template <file>',
    'the corridor settings (id, title, units, template: a batch without its sections)',
  )
  .option(
    '--stratum <material[=top]>',
    'the strata, top first (repeat): the first by its material, each next with its top as a raster or a depth, e.g. --stratum clay --stratum rock=rock-top.tif',
    collect,
  )
  .option(
    '--water <top>',
    'the groundwater level: a raster of elevations, or a depth below the ground',
  )
  .option(
    '--skip-no-data',
    'leave out a station with a sample of no data (default: refuse the cut)',
  )
  .option('-o, --out <file>', 'the GeoJSON corridor to write (default: standard output)')
  .addHelpText(
    'after',
    `
Each section is square to the alignment (at a bend's vertex, along the bisector), from --left
on the left to --right on the right looking along the chainage; the alignment is at x = left.
The ground, strata tops and water are sampled by bilinear interpolation. Run the result with
\`scarpline batch\`; its results.geojson carries the section lines.

Examples:
  $ scarpline cut examples/terrain/wendlecombe.terrain.yaml -o wendlecombe.geojson
  $ scarpline cut --terrain dem.tif --alignment line.geojson --start 1000 --every 20 \\
      --left 40 --right 40 --spacing 1 --template settings.yaml -o corridor.geojson
  $ scarpline batch corridor.geojson --out results/`,
  )
  .action(
    async (
      job: string | undefined,
      opts: import('./cut-terrain').CutOptions & { out?: string },
    ) => {
      const { cutTerrain } = await import('./cut-terrain');
      process.exitCode = await cutTerrain(job, opts.out, opts, print, printErr);
    },
  );

withOverrides(
  program
    .command('report')
    .description(
      'write a PDF report: of a section (a section file), or of a corridor (a batch file or a GeoJSON corridor, analyzed as batch does)',
    )
    .argument(
      '<file>',
      'a section file, a batch file or a GeoJSON corridor (- reads standard input)',
    ),
)
  .option(
    '-o, --out <file.pdf>',
    'the PDF to write (default: beside the input, <id>-section-report.pdf or <corridor>-corridor-report.pdf)',
  )
  .addOption(
    new Option(
      '--appendix <which>',
      'corridor report: the section pages of every station, of those below requirement, or none',
    )
      .choices(['all', 'below', 'none'])
      .default('below'),
  )
  .option('--project <name>', 'the project named in the report')
  .option('--by <name>', 'who submits the report')
  .option('-j, --jobs <n>', 'corridor: worker threads (default: one per core)')
  .option(
    '-t, --template <file>',
    'GeoJSON corridor: the corridor settings from this file instead of the collection\'s "scarpline" member',
  )
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline report examples/levee-land-side.yaml --project "Wendle flood bank" --by "J. Marsh"
  $ scarpline report examples/corridor/corridor.json --appendix all -o corridor.pdf

A report holds the title block with the review record (lines to sign when nobody has reviewed
it), the inputs, the methods and their references, the results of each case and method, the
drawing, the search, the warnings and the governing slice table; a corridor report adds the
summary, the FS along the chainage per case and the stations below requirement, and ends with
the section pages asked for. The caution and "page n of m" are on every page.
${EXIT}`,
  )
  .action(
    async (
      file: string,
      opts: {
        out?: string;
        appendix: Appendix;
        project?: string;
        by?: string;
        jobs?: string;
        template?: string;
        method?: string[];
        slices?: string;
        requiredFs?: string;
      },
    ) => {
      const jobs = opts.jobs === undefined ? undefined : Number(opts.jobs);
      if (jobs !== undefined && (!Number.isInteger(jobs) || jobs < 1))
        throw new UserError(`--jobs: ${opts.jobs} is not a whole number of 1 or more`);
      if (opts.out !== undefined && !/\.pdf$/i.test(opts.out))
        throw new UserError(`--out: ${opts.out} is not a .pdf file name`);
      const { checkOverrides } = await import('./overrides');
      const { reportFile } = await import('./report-file');
      process.exitCode = await reportFile(
        file,
        {
          out: opts.out,
          appendix: opts.appendix,
          project: opts.project,
          by: opts.by,
          template: opts.template,
          ...checkOverrides(opts),
          jobs,
          tty: process.stderr.isTTY === true,
        },
        print,
        printErr,
      );
    },
  );

withOverrides(
  program
    .command('plot')
    .description('draw the cross-section with its critical surfaces as SVG and/or PNG')
    .argument(
      '<file>',
      'a section file (or a batch, or a GeoJSON corridor; - reads standard input)',
    ),
)
  .option('--svg <out>', 'the SVG file to write (several sections: OUT-<id>.svg each)')
  .option('--png <out>', 'the PNG file to write, the same drawing (several: OUT-<id>.png each)')
  .option('-s, --section <id>', 'draw only this section of the file')
  .option('--case <name>', 'draw this design case (default: the governing case of each section)')
  .option('--width <px>', 'width of the drawing in pixels', '1100')
  .option('--radii', "draw each circle's radii to the ends of its arc")
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline plot examples/levee-land-side.yaml --svg levee.svg
  $ scarpline plot examples/levee-land-side.yaml --png levee.png
  $ scarpline plot examples/corridor/corridor.json --svg corridor.svg --section wcb-main@1600

At least one of --svg and --png.

Exit status: 0 when drawn, 1 when the file is invalid.`,
  )
  .action(
    async (
      file: string,
      opts: {
        svg?: string;
        png?: string;
        section?: string;
        case?: string;
        width: string;
        radii?: boolean;
        method?: string[];
        slices?: string;
        requiredFs?: string;
      },
    ) => {
      const width = Number(opts.width);
      if (!Number.isFinite(width) || width < 640)
        throw new UserError(`--width: ${opts.width} is not a number of pixels of 640 or more`);
      const { checkOverrides } = await import('./overrides');
      const { plotFile } = await import('./plot-file');
      process.exitCode = plotFile(
        file,
        {
          svg: opts.svg,
          png: opts.png,
          section: opts.section,
          case: opts.case,
          ...checkOverrides(opts),
          width,
          radii: opts.radii === true,
        },
        print,
        printErr,
      );
    },
  );

program
  .command('init')
  .description('write a commented starter section file')
  .argument('[file]', 'the file to write (default <kind>.yaml; - prints it)')
  .addOption(
    new Option('-k, --kind <kind>', 'the kind of slope')
      .choices(Object.keys(STARTERS))
      .default('cut'),
  )
  .option('-f, --force', 'replace the file if it exists')
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline init --kind levee my-levee.yaml
  $ scarpline init --kind sand-fill - | scarpline analyze -

Exit status: 0 when written, 1 otherwise.`,
  )
  .action((file: string | undefined, opts: { kind: string; force?: boolean }) => {
    process.exitCode = initFile(opts.kind, file, opts.force === true, print);
  });

program.addHelpText(
  'after',
  `
Examples:
  $ scarpline init --kind cut my-cut.yaml
  $ scarpline validate examples/*
  $ scarpline analyze examples/cut-homogeneous.yaml
  $ scarpline plot examples/levee-land-side.yaml --svg levee.svg
  $ scarpline batch examples/corridor/corridor.json --out results/
  $ scarpline cut examples/terrain/wendlecombe.terrain.yaml -o wendlecombe.geojson
  $ scarpline report examples/levee-land-side.yaml
${EXIT}`,
);

program.exitOverride((e) => {
  // commander's own exits: help and version are 0, usage errors 1
  process.exit(e.exitCode === 0 ? 0 : 1);
});

program.parseAsync(process.argv).catch((e: unknown) => {
  if (e instanceof UserError) console.error(`scarpline: ${e.message}`);
  else console.error(`scarpline: internal error: ${e instanceof Error ? e.message : String(e)}`);
  process.exitCode = 1;
});
