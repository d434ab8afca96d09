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
  .description(
    'check section and batch files (YAML or JSON) and corridors (GeoJSON, LandXML) and print located messages',
  )
  .argument(
    '<file...>',
    'section or batch files, GeoJSON or LandXML (.xml) corridors; a directory means every .yaml/.yml/.json in it',
  )
  .option(
    '-t, --template <file>',
    'GeoJSON or LandXML corridor: the corridor settings (id, units, template) from this file',
  )
  .addHelpText(
    'after',
    `
Example:
  $ scarpline validate examples/cut-homogeneous.yaml examples/corridor
  $ scarpline validate examples/corridor/wendlecombe-cut.xml --template examples/corridor/wendlecombe-cut.yaml

Exit status: 0 when every file is valid, 1 otherwise.`,
  )
  .action(async (files: string[], opts: { template?: string }) => {
    const { validateFiles } = await import('./validate-files');
    process.exitCode = await validateFiles(files, print, opts.template);
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
      'analyze a corridor (a batch file, a GeoJSON FeatureCollection of section lines, or LandXML cross-sections) on every core',
    )
    .argument(
      '<corridor>',
      'a batch file (format scarpline-batch/1, JSON or YAML), a GeoJSON corridor (projected, or lon/lat with a crs), a LandXML file (.xml) or a terrain job (format scarpline-terrain/1: the sections are cut first, see `scarpline cut`)',
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
    'GeoJSON or LandXML corridor: the corridor settings (id, units, template; crs, surfaces) from this file instead of the collection\'s "scarpline" member',
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
  $ scarpline batch examples/corridor/wendlecombe-cut.xml --template examples/corridor/wendlecombe-cut.yaml --out results/
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

// --- probability of failure, sensitivity, solving for a value (issue 19)
const numberOption = (name: string, v: string | undefined, whole = false): number | undefined => {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isFinite(n) || (whole && (!Number.isInteger(n) || n < 1)))
    throw new UserError(
      `${name}: ${v} is not ${whole ? 'a whole number of 1 or more' : 'a number'}`,
    );
  return n;
};

program
  .command('probability')
  .description(
    "probability of failure of each case from the section's random variables (its probability block): mean and SD of FS, P(FS < 1) and P(FS < required) with standard errors, β",
  )
  .argument('<file>', 'a section file (or a batch; - reads standard input)')
  .option('-s, --section <id>', 'only this section of the file')
  .option('--case <name>', 'only this design case (default: every case)')
  .option('-n, --realisations <n>', "number of realisations instead of the file's")
  .option('--seed <n>', "seed instead of the file's (the same seed repeats a run exactly)")
  .addOption(
    new Option('--sampling <method>', "sampling instead of the file's").choices([
      'monte-carlo',
      'latin-hypercube',
    ]),
  )
  .option('--search', 'search the critical surface again in each realisation (slow; on every core)')
  .option('--taylor', 'also the Taylor series method (2n + 1 analyses) as a cross-check')
  .option('-j, --jobs <n>', 'with --search: worker threads (default: one per core)')
  .option('--json', 'print the results as JSON (FS statistics, histogram, CDF, convergence of P_f)')
  .option(
    '--svg <out>',
    'draw the distribution of FS (several cases or sections: OUT-<id>-<case>.svg)',
  )
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline probability examples/levee-probability.yaml
  $ scarpline probability examples/levee-probability.yaml --taylor --svg fs-distribution.svg
  $ scarpline probability examples/levee-probability.yaml --search -n 500 --jobs 2 --json > p.json

Each realisation draws every variable (correlated through their normal scores), sets it on
the case, and takes the FS on the case's critical surface at the means (or, with --search,
on the surface searched again). P(FS < 1) is counted, with its standard error √(P(1 − P)/N).

Exit status: 0 when analyzed, 1 when the file is invalid or gives no random variables.`,
  )
  .action(
    async (
      file: string,
      opts: {
        section?: string;
        case?: string;
        realisations?: string;
        seed?: string;
        sampling?: 'monte-carlo' | 'latin-hypercube';
        search?: boolean;
        taylor?: boolean;
        jobs?: string;
        json?: boolean;
        svg?: string;
      },
    ) => {
      const { probabilityFile } = await import('./probability-files');
      process.exitCode = await probabilityFile(
        file,
        {
          section: opts.section,
          case: opts.case,
          realisations: numberOption('--realisations', opts.realisations, true),
          seed: numberOption('--seed', opts.seed),
          method: opts.sampling,
          search: opts.search === true,
          taylor: opts.taylor === true,
          jobs: numberOption('--jobs', opts.jobs, true),
          json: opts.json === true,
          svg: opts.svg,
        },
        print,
        printErr,
      );
    },
  );

program
  .command('sensitivity')
  .description(
    'how the FS of each case moves as each random variable goes over its range, the others at their means (one at a time), and the tornado of FS ranges',
  )
  .argument(
    '<file>',
    'a section file with a probability block (or a batch; - reads standard input)',
  )
  .option('-s, --section <id>', 'only this section of the file')
  .option('--case <name>', 'only this design case (default: every case)')
  .option('--points <n>', 'values over each range', '11')
  .option('--search', 'search the critical surface again at each value')
  .option('--json', 'print the series as JSON')
  .option(
    '--svg <out>',
    'draw FS against each variable (several cases or sections: OUT-<id>-<case>.svg)',
  )
  .option('--tornado <out>', 'draw the tornado chart (several: OUT-<id>-<case>.svg)')
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline sensitivity examples/levee-probability.yaml
  $ scarpline sensitivity examples/levee-probability.yaml --svg one-at-a-time.svg --tornado tornado.svg

Each variable's range is its 1st to 99th percentile (a uniform or triangular one: its bounds).

Exit status: 0 when analyzed, 1 when the file is invalid or gives no random variables.`,
  )
  .action(
    async (
      file: string,
      opts: {
        section?: string;
        case?: string;
        points: string;
        search?: boolean;
        json?: boolean;
        svg?: string;
        tornado?: string;
      },
    ) => {
      const { sensitivityFile } = await import('./probability-files');
      process.exitCode = sensitivityFile(
        file,
        {
          section: opts.section,
          case: opts.case,
          points: numberOption('--points', opts.points, true),
          search: opts.search === true,
          json: opts.json === true,
          svg: opts.svg,
          tornado: opts.tornado,
        },
        print,
        printErr,
      );
    },
  );

program
  .command('solve')
  .description(
    'find the value of one input at which the critical FS (the full analysis at every step) equals a target: back-analysis (1.0) or design (the required FS)',
  )
  .argument('<file>', 'a section file (or a batch; - reads standard input)')
  .requiredOption(
    '--for <input>',
    'the input: materials.<name>.<parameter>, water.level, loads.<i>.<parameter>, seismic.kh, ground.<i>.x|y, infiniteSlope.angle, reinforcement.<name>.<parameter>, …',
  )
  .requiredOption('--target <fs>', 'the factor of safety to reach')
  .requiredOption(
    '--range <a,b>',
    "the values to look in, in the file's units (water.level: a shift)",
  )
  .option('-s, --section <id>', 'only this section of the file')
  .option('--case <name>', 'this design case (default: the first)')
  .option('--scan <n>', 'values the range is first scanned at to bracket the answer', '9')
  .option('--json', 'print the result as JSON, with every analysis made')
  .addHelpText(
    'after',
    `
Examples:
  $ scarpline solve examples/levee-probability.yaml --for materials.alluvium.frictionAngle --target 1.0 --range 10,30
  $ scarpline solve examples/levee-probability.yaml --for water.level --target 1.5 --range -4,0

The range is scanned, a change of side of the target bracketed, and the value refined by
Brent's method; when the FS stays on one side of the target over the range, it says so.

Exit status: 0 when a value was found, 2 when the range holds none, 1 when the input is invalid.`,
  )
  .action(
    async (
      file: string,
      opts: {
        for: string;
        target: string;
        range: string;
        section?: string;
        case?: string;
        scan: string;
        json?: boolean;
      },
    ) => {
      const range = opts.range.split(',').map((v) => Number(v.trim()));
      if (range.length !== 2 || !range.every(Number.isFinite) || range[0] === range[1])
        throw new UserError(`--range: ${opts.range} is not two different numbers a,b`);
      const target = numberOption('--target', opts.target)!;
      if (!(target > 0))
        throw new UserError(`--target: ${opts.target} is not a factor of safety above 0`);
      const { solveFile } = await import('./probability-files');
      process.exitCode = solveFile(
        file,
        {
          for: opts.for,
          target,
          range: [range[0], range[1]],
          section: opts.section,
          case: opts.case,
          scan: numberOption('--scan', opts.scan, true),
          json: opts.json === true,
        },
        print,
        printErr,
      );
    },
  );
// --- end of issue 19's commands

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
  $ scarpline probability examples/levee-probability.yaml
  $ scarpline solve examples/levee-probability.yaml --for water.level --target 1.5 --range -4,0
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
