/**
 * The `lampwalk` command. It reads and writes the same survey file as the
 * app's backups (see docs/file-format.md).
 *
 *   lampwalk calc <survey.json | ->   every result as JSON
 *   lampwalk demo                     the demo survey as a survey file
 *
 * Exit codes: 0 done; 2 bad input or usage (with a message naming the field
 * and the problem); 1 an unexpected failure.
 */
import { CalcInputError } from '../calc/errors.ts';
import { calculateSurvey, type SurveyResult } from '../calc/survey.ts';
import { demoSurvey } from '../survey/demo.ts';
import { exampleCatalog } from '../survey/examples.ts';
import { makeSurveyFile } from '../survey/format.ts';
import { parseSurveyFileText, type FileProblem } from '../survey/validate.ts';

/** What the command needs from its surroundings (so tests can run it in-process). */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): Promise<string>;
  readStdin(): Promise<string>;
}

export const cliVersion = '0.1.0';

/** Name and version of the JSON that `lampwalk calc` prints. */
export const calcOutputFormat = { format: 'lampwalk-calc-result', version: 1 } as const;

const usage = `Usage: lampwalk <command> [options]

Commands:
  calc <file>      Calculate a survey file ("-" reads standard input) and print
                   every result as JSON: totals, economics, rooms, entries,
                   circuits and warnings.
                   --survey <id>   only the survey with this id
                   --compact       one line of JSON instead of indented
  demo             Print the demo survey as a survey file.
  help             Show this text.

Exit codes: 0 done, 2 bad input or usage, 1 unexpected failure.
`;

class UsageError extends Error {}

interface CalcOptions {
  file: string;
  surveyId: string | null;
  compact: boolean;
}

function parseCalcArgs(args: readonly string[]): CalcOptions {
  let file: string | null = null;
  let surveyId: string | null = null;
  let compact = false;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg === '--survey') {
      const next = args[i + 1];
      if (next === undefined || next.startsWith('--')) throw new UsageError('--survey needs a survey id');
      surveyId = next;
      i++;
    } else if (arg === '--compact') {
      compact = true;
    } else if (arg.startsWith('--')) {
      throw new UsageError(`unknown option ${arg}`);
    } else if (file === null) {
      file = arg;
    } else {
      throw new UsageError(`unexpected argument "${arg}"`);
    }
  }
  if (file === null) throw new UsageError('calc needs a survey file (or "-" for standard input)');
  return { file, surveyId, compact };
}

function describeProblems(source: string, problems: readonly FileProblem[]): string {
  const lines = problems.map((p) => `  ${p.path}: ${p.message}`);
  return `lampwalk: ${source} is not a valid survey file:\n${lines.join('\n')}\n`;
}

async function readInput(io: CliIo, file: string): Promise<string> {
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

async function runCalc(args: readonly string[], io: CliIo): Promise<number> {
  const options = parseCalcArgs(args);
  const text = await readInput(io, options.file);
  const parsed = parseSurveyFileText(text);
  if (!parsed.ok) {
    io.stderr(describeProblems(options.file === '-' ? 'standard input' : options.file, parsed.problems));
    return 2;
  }
  let surveys = parsed.file.surveys.map((s, index) => ({ survey: s, index }));
  if (options.surveyId !== null) {
    surveys = surveys.filter((s) => s.survey.id === options.surveyId);
    if (surveys.length === 0) throw new UsageError(`no survey with id "${options.surveyId}" in ${options.file}`);
  }
  const results: SurveyResult[] = [];
  for (const { survey, index } of surveys) {
    try {
      results.push(calculateSurvey(survey));
    } catch (err) {
      if (err instanceof CalcInputError) {
        io.stderr(describeProblems(options.file, [{ path: `surveys[${index}].${err.field}`, message: err.problem }]));
        return 2;
      }
      throw err;
    }
  }
  const output = { ...calcOutputFormat, generatedBy: `lampwalk ${cliVersion}`, surveys: results };
  io.stdout(`${JSON.stringify(output, null, options.compact ? undefined : 2)}\n`);
  return 0;
}

/**
 * Runs the command with `args` (without the program name) and returns the exit code.
 *
 * @example await main(['demo'], io) //=> 0, with the demo survey file on stdout
 */
export async function main(args: readonly string[], io: CliIo): Promise<number> {
  const [command, ...rest] = args;
  try {
    switch (command) {
      case 'calc':
        return await runCalc(rest, io);
      case 'demo': {
        if (rest.length > 0) throw new UsageError(`demo takes no arguments (got "${rest.join(' ')}")`);
        const file = makeSurveyFile([demoSurvey()], [...exampleCatalog], new Date());
        io.stdout(`${JSON.stringify(file, null, 2)}\n`);
        return 0;
      }
      case 'help':
      case '--help':
      case '-h':
        io.stdout(usage);
        return 0;
      case '--version':
        io.stdout(`lampwalk ${cliVersion}\n`);
        return 0;
      case undefined:
        io.stderr(usage);
        return 2;
      default:
        throw new UsageError(`unknown command "${command}"`);
    }
  } catch (err) {
    if (err instanceof UsageError) {
      io.stderr(`lampwalk: ${err.message}\nRun "lampwalk help" for usage.\n`);
      return 2;
    }
    const message = err instanceof Error ? err.message : String(err);
    io.stderr(`lampwalk: unexpected failure: ${message}\nPlease report this with the file that caused it.\n`);
    return 1;
  }
}
