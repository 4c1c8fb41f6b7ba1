/**
 * What every `lampwalk` command shares: its surroundings (`CliIo`), the usage
 * error (exit code 2), flag values (whole numbers, dates), reading the input
 * file, writing an output file, printing a file's problems and picking the
 * one survey a command works on.
 */
import type { Survey } from '../survey/model.ts';
import type { FileProblem } from '../survey/validate.ts';

/** What the command needs from its surroundings (so tests can run it in-process). */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): Promise<string>;
  readStdin(): Promise<string>;
  /** Writes a file (the PDF commands need it). */
  writeFile?(path: string, bytes: Uint8Array): Promise<void>;
}

/** Bad input or usage: printed with a pointer to `lampwalk help`, exit code 2. */
export class UsageError extends Error {}

/**
 * The value after the flag at `args[i]`; a missing value, or one that looks
 * like another flag ("-" alone is standard input), is a usage error.
 *
 * @example flagValue(['--spare', '10'], 0) //=> '10'
 */
export function flagValue(args: readonly string[], i: number): string {
  const value = args[i + 1];
  if (value === undefined || (value.startsWith('-') && value !== '-')) throw new UsageError(`${args[i]} needs a value`);
  return value;
}

/**
 * A whole-number flag value from `min` to `max`.
 *
 * @example wholeNumber('--spare', '10', 0, 100) //=> 10
 */
export function wholeNumber(flag: string, text: string, min: number, max: number): number {
  if (!/^\d+$/.test(text) || Number(text) < min || Number(text) > max) {
    throw new UsageError(`${flag} must be a whole number from ${min} to ${max} (got "${text}")`);
  }
  return Number(text);
}

/**
 * A `--date` value written YYYY-MM-DD, as local midnight of that day.
 *
 * @example parseDate('2024-02-29').getDate() //=> 29
 */
export function parseDate(text: string): Date {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  const date = match ? new Date(Number(match[1]), Number(match[2]) - 1, Number(match[3])) : null;
  if (!match || !date || date.getMonth() !== Number(match[2]) - 1 || date.getDate() !== Number(match[3])) {
    throw new UsageError(`--date must be a date written YYYY-MM-DD (got "${text}")`);
  }
  return date;
}

/**
 * How messages name the input: the file name, or "standard input" for "-".
 *
 * @example sourceName('-') //=> 'standard input'
 */
export function sourceName(file: string): string {
  return file === '-' ? 'standard input' : file;
}

/**
 * The message for a survey file that fails its checks, one problem a line.
 *
 * @example describeProblems('a.json', [{ path: 'surveys[0].name', message: 'is empty' }]) //=> 'lampwalk: a.json is not a valid survey file:\n  surveys[0].name: is empty\n'
 */
export function describeProblems(source: string, problems: readonly FileProblem[]): string {
  const lines = problems.map((p) => `  ${p.path}: ${p.message}`);
  return `lampwalk: ${source} is not a valid survey file:\n${lines.join('\n')}\n`;
}

/**
 * Reads the input file ("-" reads standard input); a file that cannot be read is a usage error saying why.
 *
 * @example await readInput(io, 'missing.json') // throws UsageError('missing.json: no such file')
 */
export async function readInput(io: CliIo, file: string): Promise<string> {
  if (file === '-') return io.readStdin();
  try {
    return await io.readFile(file);
  } catch (err) {
    const code = typeof err === 'object' && err !== null && 'code' in err ? String(err.code) : '';
    const reason =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a file' : code === 'EACCES' ? 'permission denied' : 'cannot be read';
    throw new UsageError(`${file}: ${reason}`);
  }
}

/**
 * Writes an output file; one that cannot be written is a usage error saying why.
 *
 * @example await writeOutput(io, 'no-such-folder/a.pdf', bytes) // throws UsageError('no-such-folder/a.pdf: its folder does not exist')
 */
export async function writeOutput(io: CliIo, path: string, bytes: Uint8Array): Promise<void> {
  if (!io.writeFile) throw new UsageError('this environment cannot write files');
  try {
    await io.writeFile(path, bytes);
  } catch (err) {
    const code = typeof err === 'object' && err !== null && 'code' in err ? String(err.code) : '';
    const reason =
      code === 'ENOENT' ? 'its folder does not exist' : code === 'EISDIR' ? 'is a folder' : code === 'EACCES' ? 'permission denied' : 'cannot be written';
    throw new UsageError(`${path}: ${reason}`);
  }
}

/**
 * The one survey a command works on, with its index in the file: the one
 * with `surveyId`, or the file's only survey. No match, no survey, or several
 * without `--survey` is a usage error.
 *
 * @example pickOneSurvey(file.surveys, null, 'a.json') //=> { survey: file.surveys[0], index: 0 } when the file holds one survey
 */
export function pickOneSurvey(surveys: readonly Survey[], surveyId: string | null, source: string): { survey: Survey; index: number } {
  const all = surveys.map((survey, index) => ({ survey, index }));
  let chosen = all;
  if (surveyId !== null) {
    chosen = all.filter((s) => s.survey.id === surveyId);
    if (chosen.length === 0) throw new UsageError(`no survey with id "${surveyId}" in ${source}`);
  } else if (all.length === 0) {
    throw new UsageError(`${source} holds no survey`);
  } else if (all.length > 1) {
    throw new UsageError(`${source} holds ${all.length} surveys; pick one with --survey <id> (${all.map((s) => s.survey.id).join(', ')})`);
  }
  return chosen[0]!;
}

/**
 * Reads a command's arguments: one file (or "-" for standard input) and the
 * flags in `allowed`. `onSwitch` is asked first for each flag and returns true
 * for a flag without a value; every other flag takes the next argument as its
 * value and goes to `onValue`. Returns the file. Unknown flags, missing
 * values, a second file and no file at all are usage errors.
 *
 * @example parseCommandLine('orders', ['a.json', '--spare', '10'], ['--spare'], (flag, value) => set(flag, value)) //=> 'a.json'
 */
export function parseCommandLine(
  command: string,
  args: readonly string[],
  allowed: readonly string[],
  onValue: (flag: string, value: string) => void,
  onSwitch: (flag: string) => boolean = () => false,
): string {
  const known = new Set(allowed);
  let file: string | null = null;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg.startsWith('-') && arg !== '-') {
      if (!known.has(arg)) throw new UsageError(`unknown option ${arg} for ${command}`);
      if (onSwitch(arg)) continue;
      const value = flagValue(args, i);
      i++;
      onValue(arg, value);
    } else if (file === null) {
      file = arg;
    } else {
      throw new UsageError(`unexpected argument "${arg}"`);
    }
  }
  if (file === null) throw new UsageError(`${command} needs a survey file (or "-" for standard input)`);
  return file;
}
