import { computeModeTable, modeTableReport } from '../../../shared/engine/mode-table';
import { readPatchFile } from '../read-patch-file';
import { CliError } from '../cli-error';

export const modesUsage = 'modes PATCH.json';

/** `modes PATCH.json`: prints the mode table of a patch as JSON. */
export async function modesCommand(positionals: string[]): Promise<string> {
  if (positionals.length !== 1) throw new CliError(`usage: ${modesUsage}`);
  const patch = await readPatchFile(positionals[0]);
  return JSON.stringify(modeTableReport(computeModeTable(patch)), null, 2);
}
