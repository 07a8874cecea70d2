import { readFile, stat } from 'node:fs/promises';
import { LIMITS } from '../../shared/limits';
import type { Patch } from '../../shared/patch/patch-schema';
import { validatePatch } from '../../shared/patch/validate-patch';
import { CliError } from './cli-error';

/** Reads and validates a patch JSON file; any problem becomes one CliError line naming the field. */
export async function readPatchFile(path: string): Promise<Patch> {
  let text: string;
  try {
    const info = await stat(path);
    if (!info.isFile()) throw new CliError(`${path} is not a file`);
    if (info.size > LIMITS.maxPatchFileBytes) {
      throw new CliError(`${path} is ${info.size} bytes; a patch file may be at most ${LIMITS.maxPatchFileBytes} bytes`);
    }
    text = await readFile(path, 'utf8');
  } catch (error) {
    if (error instanceof CliError) throw error;
    const code = (error as NodeJS.ErrnoException).code;
    throw new CliError(code === 'ENOENT' ? `${path} does not exist` : `cannot read ${path} (${code ?? 'unknown error'})`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new CliError(`${path} is not valid JSON: ${(error as Error).message}`);
  }
  const result = validatePatch(json);
  if (!result.ok) {
    const [first, ...rest] = result.issues;
    const more = rest.length > 0 ? ` (and ${rest.length} more problem${rest.length === 1 ? '' : 's'})` : '';
    throw new CliError(`${first.message}${more}`);
  }
  return result.value;
}
