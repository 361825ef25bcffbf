/**
 * The command line as a pure function: `runCli(argv)` → {stdout, stderr, exitCode}. No process
 * I/O here (main.ts does that), so tests run every command in-process.
 *
 * Startup: each command's module (and with it the prover, the checker, decimal.js) is imported
 * only when that command runs, so `orbitseal --version` and `--help` load commander and little
 * else. Keep the static imports below light (no command modules, nothing that loads decimal.js).
 */
import { Command, CommanderError } from 'commander';
import { packageVersion } from '../certificate/producer.js';
import { errorResult, EXIT_USAGE, type CommandResult } from './errors.js';
import { DEFAULT_AUDIT_DIR, DEFAULT_OUT_DIR, DEFAULT_REPORT_FILE } from './options.js';
import type { CheckCommandOptions } from './commands/check.js';
import type { CountCommandOptions, MergeCommandOptions } from './commands/count.js';
import type { DemoCommandOptions } from './commands/demo.js';
import type { FindCommandOptions } from './commands/find.js';
import type { ProveCommandOptions } from './commands/prove.js';
import type { ShowCommandOptions } from './commands/show.js';
import type { ReportCommandOptions } from './commands/report.js';
import type { CatalogueCommandOptions } from './commands/catalogue.js';
import type { WindowCommandOptions } from './commands/window.js';
import type { EdgesCommandOptions } from './commands/edges.js';
import type { AuditCommandOptions } from './commands/audit.js';

/** Commander collector for repeatable options. */
export function collect(value: string, previous: string[] | undefined): string[] {
  return [...(previous ?? []), value];
}

export interface RunContext {
  /** Working folder for relative paths (default process.cwd()). */
  cwd?: string;
  /** Live progress of long commands (main.ts passes stderr only when it is a terminal). */
  progress?: (text: string) => void;
  /** Terminal width to fit human-readable output to (main.ts: COLUMNS, the terminal, else 80); default no limit. */
  columns?: number;
}

const EFFORT_HELP = 'multiply the float search effort by E (default 1; it already grows with the period and the map\'s expansion)';
const PARAM_HELP = 'override a parameter: name=decimal or name=[lo,hi] (exact decimals; repeatable)';

/**
 * Run the command line on `argv` (without `node` and the script) and return what it would print
 * and its exit code: 0 all proven / verified, 1 something not proven or rejected, 2 bad input, 3 bug.
 */
export async function runCli(argv: readonly string[], ctx: RunContext = {}): Promise<CommandResult> {
  const cwd = ctx.cwd ?? process.cwd();
  const columns = ctx.columns ?? Infinity;
  let out = '';
  let err = '';
  let result: CommandResult | undefined;
  let wantsJson = false;
  const run = (f: () => Promise<CommandResult>) => async () => {
    result = await f();
  };

  const program = new Command();
  program
    .name('orbitseal')
    .description('Proofs of periodic orbits of iterated maps, with certificates an independent checker re-verifies.')
    .version(packageVersion(), '-V, --version', 'print the version')
    .helpOption('-h, --help', 'show help')
    .exitOverride()
    .configureOutput({ writeOut: (s) => (out += s), writeErr: (s) => (err += s) })
    .showSuggestionAfterError(true)
    .addHelpText(
      'after',
      '\nExit codes: 0 all proven / verified, 1 something not proven or rejected, 2 bad input, 3 internal error.\n' +
        'Examples:\n  orbitseal demo\n  orbitseal show logistic --param r=3.83\n  orbitseal prove logistic --period 3 --param r=3.83\n  orbitseal check orbitseal-proofs/\n  orbitseal report orbitseal-proofs/ --out report.html',
    );

  program
    .command('show')
    .description('show the map as understood: variables, exact parameter enclosures, formulas, region and its interval image')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .option('--param <name=value>', PARAM_HELP, collect)
    .option('--json', 'print one JSON document')
    .action((map: string, o: ShowCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/show.js')).showCommand(map, { ...o, columns }, cwd))();
    });

  program
    .command('find')
    .description('float search for orbit candidates of minimal period P (not proofs)')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .requiredOption('--period <P>', 'minimal period')
    .option('--near <x,y,...>', 'look near this point')
    .option('--effort <E>', EFFORT_HELP)
    .option('--param <name=value>', PARAM_HELP, collect)
    .option('--limit <N>', 'list at most N candidates (the number found is always given)')
    .option('--json', 'print one JSON document')
    .action((map: string, o: FindCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/find.js')).findCommand(map, { ...o, columns }, cwd, ctx.progress))();
    });

  program
    .command('prove')
    .description('prove periodic orbits, write a certificate for each, and re-check each with the independent checker')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .requiredOption('--period <P>', 'period of the orbits to prove')
    .option('--near <x,y,...>', 'prove the orbit through this point, else the candidate nearest it (with --limit N: the N nearest)')
    .option('--limit <N>', 'prove at most N candidates (default 20; nearest to --near first); the search stops once N exist')
    .option('--all', 'prove every candidate this search found (not a proof that there are no others)')
    .option('--effort <E>', EFFORT_HELP)
    .option('--start <x0,y0,...>', 'prove the orbit through this one point (exact decimals, any number of digits); no search')
    .option('--points <file>', 'prove the orbit approximated by these p points (CSV one point per line, or JSON); no search')
    .option('--out <dir>', 'folder for certificates', DEFAULT_OUT_DIR)
    .option('--force', 'replace existing certificate files')
    .option('--max-bits <B>', 'highest working precision for precision escalation')
    .option('--no-check', 'do not run the independent checker (results are then labelled "fast engine only")')
    .option('--digits <D>', 'decimal digits for the checker (default: the certificate hint)')
    .option('--workers <K>', 'worker threads (default: the number of cores); certificates are the same for any K')
    .option('--recheck', 'a re-run resumes the orbits an earlier run of the same command finished; re-check their certificates instead of relying on the recorded verdict')
    .option('--param <name=value>', PARAM_HELP, collect)
    .option('--json', 'print one JSON document')
    .action((map: string, o: ProveCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/prove.js')).proveCommand(map, { ...o, columns }, cwd, ctx.progress))();
    });

  const RANGE_HELP = 'parameter: name=decimal or name=[lo,hi] (exactly one as a range; repeatable)';
  program
    .command('window')
    .description('prove that for every parameter in a range one orbit of minimal period P exists, continues and has one stability; one certificate')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .requiredOption('--period <P>', 'minimal period')
    .option('--param <name=value>', RANGE_HELP, collect)
    .option('--near <x,...>', 'follow the orbit through (near) this point')
    .option('--min-width <w>', 'do not split parameter pieces narrower than this')
    .option('--out <dir>', 'folder for the certificate', DEFAULT_OUT_DIR)
    .option('--force', 'replace an existing certificate file')
    .option('--no-check', 'do not run the independent checker')
    .option('--json', 'print one JSON document')
    .action((map: string, o: WindowCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/window.js')).windowCommand(map, o, cwd, ctx.progress))();
    });

  program
    .command('edges')
    .description('enclose fold (multiplier +1 / det(M − I) = 0), flip (−1 / det(M + I) = 0) and superstable parameters of period-P orbits in a range')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .requiredOption('--period <P>', 'period of the orbits')
    .option('--param <name=value>', RANGE_HELP, collect)
    .option('--kind <list>', 'fold, flip, superstable (comma-separated; default fold,flip)')
    .option('--samples <N>', 'parameter samples for the float seeds (default 12)')
    .option('--critical <c>', 'with --kind superstable: count them exactly (orbit of the critical point c, the rest of the range excluded)')
    .option('--out <dir>', 'folder for certificates', DEFAULT_OUT_DIR)
    .option('--force', 'replace existing certificate files')
    .option('--no-check', 'do not run the independent checker')
    .option('--json', 'print one JSON document')
    .action((map: string, o: EdgesCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/edges.js')).edgesCommand(map, o, cwd, ctx.progress))();
    });

  program
    .command('audit')
    .description('check every claim of a claims file (docs/windows.md): CONFIRMED / REFUTED / UNDECIDED, with certificates; exit 0 only if all are confirmed')
    .argument('<claims-file>', 'YAML or JSON claims file')
    .option('--out <dir>', 'folder for certificates (one sub-folder per claim)', DEFAULT_AUDIT_DIR)
    .option('--force', 'replace existing certificate files')
    .option('--json', 'print one JSON document')
    .action((file: string, o: AuditCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/audit.js')).auditCommand(file, o, cwd, ctx.progress))();
    });

  program
    .command('check')
    .description('re-verify certificates with the independent checker: VERIFIED / REJECTED / UNREADABLE')
    .argument('<paths...>', 'certificate files or folders (all *.json inside)')
    .option('--digits <D>', 'decimal digits for the checker')
    .option('--workers <K>', 'worker threads (default: the number of cores); output is the same for any K')
    .option('--max-work <W>', 'refuse certificates whose estimated work exceeds W units (default 2e8, minutes)')
    .option('--json', 'print one JSON document')
    .action((paths: string[], o: CheckCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/check.js')).checkCommand(paths, { ...o, columns }, cwd, ctx.progress))();
    });

  program
    .command('report')
    .description('re-check certificates and write one self-contained HTML page with their claims and plots (no network, no script)')
    .argument('<paths...>', 'certificate files or folders (all *.json inside)')
    .option('--out <file>', 'the HTML file to write (replaced if it exists)', DEFAULT_REPORT_FILE)
    .option('--svg <dir>', 'also write every plot as a stand-alone SVG file into this folder')
    .option('--title <text>', 'page title')
    .option('--digits <D>', 'decimal digits for the checker')
    .option('--json', 'print one JSON document')
    .action((paths: string[], o: ReportCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/report.js')).reportCommand(paths, o, cwd, ctx.progress))();
    });

  program
    .command('catalogue')
    .description('list the published maps that can be named instead of a map file: formulas, default parameters, region, source')
    .option('--json', 'print one JSON document')
    .action((o: CatalogueCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/catalogue.js')).catalogueCommand(o))();
    });

  program
    .command('demo')
    .description('prove the orbits of two built-in invented scenarios, write and re-check certificates (a few seconds)')
    .option('--out <dir>', 'folder for certificates (default: a new temporary folder)')
    .option('--json', 'print one JSON document')
    .action((o: DemoCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/demo.js')).demoCommand(o, cwd))();
    });

  program
    .command('count')
    .description('count every periodic orbit of period P in the region: each orbit proven, the rest excluded; writes a count certificate')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .requiredOption('--period <P>', 'period (orbits of lower periods dividing P are told apart)')
    .option('--upto', 'count every period 1..P')
    .option('--region <name=[lo,hi]>', 'region per state variable (exact decimals; repeatable; default the map region)', collect)
    .option('--workers <K>', 'worker threads (default 1)')
    .option('--shard <i/n>', 'run only shard i of n and write a partial certificate (combine with merge)')
    .option('--pieces <k>', 'cut the work into 2^k pieces (default 6)')
    .option('--method <name>', 'shooting (branch and prune on region^P; n = 1 always) or box-graph (default for n >= 2)')
    .option('--level <L>', 'box graph: level of the base cover, 2^L slabs per coordinate (default 6)')
    .option('--max-level <L>', 'box graph: finest level of the per-period refinement (default 12)')
    .option('--out <file>', 'write the certificate (or partial certificate) here')
    .option('--force', 'replace an existing file')
    .option('--no-check', 'do not run the independent checker')
    .option('--param <name=value>', PARAM_HELP, collect)
    .option('--json', 'print one JSON document')
    .action((map: string, o: CountCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/count.js')).countCommand(map, o, cwd, ctx.progress))();
    });

  program
    .command('merge')
    .description('combine the partial certificates of all shards of one count run into one count certificate')
    .argument('<parts...>', 'partial certificate files (count --shard i/n --out FILE)')
    .option('--out <file>', 'write the merged certificate here')
    .option('--force', 'replace an existing file')
    .option('--no-check', 'do not run the independent checker')
    .option('--json', 'print one JSON document')
    .action((parts: string[], o: MergeCommandOptions) => {
      wantsJson = !!o.json;
      return run(async () => (await import('./commands/count.js')).mergeCommand(parts, o, cwd))();
    });

  try {
    await program.parseAsync([...argv], { from: 'user' });
  } catch (e) {
    if (e instanceof CommanderError) {
      // `orbitseal help [command]` displays help with exit code 0 (commander.help, exitCode 0)
      if (e.code === 'commander.helpDisplayed' || e.code === 'commander.version' || (e.code === 'commander.help' && e.exitCode === 0)) {
        return { stdout: out, stderr: err, exitCode: 0 };
      }
      const hint = e.code === 'commander.help' ? '' : '  hint: run `orbitseal --help` (or `orbitseal COMMAND --help`) for usage\n';
      return { stdout: out, stderr: err + hint, exitCode: EXIT_USAGE };
    }
    return errorResult(e, wantsJson);
  }
  if (result === undefined) {
    // no command given
    return { stdout: '', stderr: program.helpInformation(), exitCode: EXIT_USAGE };
  }
  if (!wantsJson && Number.isFinite(columns)) {
    const { fitText } = await import('./format.js');
    result = { ...result, stdout: fitText(result.stdout, columns) };
  }
  return result;
}
