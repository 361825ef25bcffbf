/** Registers `window`, `edges` and `audit` on the program (kept apart so program.ts stays small). */
import type { Command } from 'commander';
import type { CommandResult } from '../errors.js';
import { collect } from '../options.js';
import { edgesCommand, type EdgesCommandOptions } from './edges.js';
import { windowCommand, type WindowCommandOptions } from './window.js';
import { DEFAULT_OUT_DIR } from './prove.js';
import { auditCommand, DEFAULT_AUDIT_DIR, type AuditCommandOptions } from './audit.js';

export interface RegisterContext {
  cwd: string;
  progress?: (text: string) => void;
  json: (on: boolean) => void;
  run: (f: () => Promise<CommandResult>) => Promise<void>;
}

const PARAM_HELP = 'parameter: name=decimal or name=[lo,hi] (exactly one as a range; repeatable)';

export function registerWindowCommands(program: Command, ctx: RegisterContext): void {
  program
    .command('window')
    .description('prove that for every parameter in a range one orbit of minimal period P exists, continues and has one stability; one certificate')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .requiredOption('--period <P>', 'minimal period')
    .option('--param <name=value>', PARAM_HELP, collect)
    .option('--near <x,...>', 'follow the orbit through (near) this point')
    .option('--min-width <w>', 'do not split parameter pieces narrower than this')
    .option('--out <dir>', 'folder for the certificate', DEFAULT_OUT_DIR)
    .option('--force', 'replace an existing certificate file')
    .option('--no-check', 'do not run the independent checker')
    .option('--json', 'print one JSON document')
    .action((map: string, o: WindowCommandOptions) => {
      ctx.json(!!o.json);
      return ctx.run(() => windowCommand(map, o, ctx.cwd, ctx.progress));
    });

  program
    .command('edges')
    .description('enclose fold (multiplier +1), flip (−1) and superstable parameters of period-P orbits in a range (one-dimensional maps)')
    .argument('<map>', 'catalogue name or map file (YAML/JSON)')
    .requiredOption('--period <P>', 'period of the orbits')
    .option('--param <name=value>', PARAM_HELP, collect)
    .option('--kind <list>', 'fold, flip, superstable (comma-separated; default fold,flip)')
    .option('--samples <N>', 'parameter samples for the float seeds (default 12)')
    .option('--out <dir>', 'folder for certificates', DEFAULT_OUT_DIR)
    .option('--force', 'replace existing certificate files')
    .option('--no-check', 'do not run the independent checker')
    .option('--json', 'print one JSON document')
    .action((map: string, o: EdgesCommandOptions) => {
      ctx.json(!!o.json);
      return ctx.run(() => edgesCommand(map, o, ctx.cwd, ctx.progress));
    });

  program
    .command('audit')
    .description('check every claim of a claims file (docs/windows.md): CONFIRMED / REFUTED / UNDECIDED, with certificates; exit 0 only if all are confirmed')
    .argument('<claims-file>', 'YAML or JSON claims file')
    .option('--out <dir>', 'folder for certificates (one sub-folder per claim)', DEFAULT_AUDIT_DIR)
    .option('--force', 'replace existing certificate files')
    .option('--json', 'print one JSON document')
    .action((file: string, o: AuditCommandOptions) => {
      ctx.json(!!o.json);
      return ctx.run(() => auditCommand(file, o, ctx.cwd, ctx.progress));
    });
}
