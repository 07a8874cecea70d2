import { parseArgs } from 'node:util';
import { systemClock } from '../clock';
import { CliError } from './cli-error';
import { modesCommand, modesUsage } from './commands/modes';
import { renderCommand, renderUsage } from './commands/render';

const help = `Tautline command line

  npm run --silent cli -- ${modesUsage}
      Print the mode table of a patch as JSON.
  npm run --silent cli -- ${renderUsage}
      Render the sound at the pickup to a mono WAV file (default pcm24, peak-normalised to -1 dBFS).
`;

async function run(argv: string[]): Promise<string> {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        out: { type: 'string' },
        format: { type: 'string' },
        normalize: { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (error) {
    throw new CliError((error as Error).message.split('\n')[0]);
  }
  const [command, ...rest] = parsed.positionals;
  if (parsed.values.help || command === undefined || command === 'help') return help.trimEnd();
  const flags = parsed.values;
  if (command === 'modes') {
    if (flags.out || flags.format || flags.normalize) throw new CliError(`modes takes no flags: ${modesUsage}`);
    return modesCommand(rest);
  }
  if (command === 'render') return renderCommand(rest, flags, (line) => process.stderr.write(`${line}\n`), systemClock);
  throw new CliError(`unknown command ${JSON.stringify(command)}; commands: modes, render (see --help)`);
}

run(process.argv.slice(2)).then(
  (output) => {
    process.stdout.write(`${output}\n`);
  },
  (error: unknown) => {
    if (error instanceof CliError) {
      process.stderr.write(`error: ${error.message}\n`);
      process.exitCode = error.exitCode;
    } else {
      process.stderr.write(`error: ${(error as Error)?.message ?? String(error)}\n`);
      process.exitCode = 1;
    }
  },
);
