/**
 * The `lampwalk` command. It reads and writes the same survey file as the
 * app's backups (see docs/file-format.md).
 *
 *   lampwalk calc <survey.json | ->   every result as JSON
 *   lampwalk report <survey.json> -o report.pdf    the client report
 *   lampwalk quote <survey.json> -o quote.pdf      the contractor quote
 *   lampwalk orders <survey.json>     the order list as CSV
 *   lampwalk schedule <survey.json>   the fixture schedule as CSV
 *   lampwalk plan <file> --budget <amount> --years <n>   the phased plan as JSON (see plan.ts)
 *   lampwalk summary <file> -o summary.pdf                the portfolio summary
 *   lampwalk phase-orders <file>                          the order list by plan year
 *   lampwalk choose <survey.json>     propose the best catalog product per entry (JSON)
 *   lampwalk demo [--portfolio]       the demo survey (with --portfolio: and the landlord layouts and their portfolio) as a survey file
 *
 * Exit codes: 0 done; 2 bad input or usage (with a message naming the field
 * and the problem); 1 an unexpected failure.
 */
import { CalcInputError } from '../calc/errors.ts';
import { applyChoices, chooseProducts, type SurveyChoice } from '../calc/choice.ts';
import { calculateSurvey, type SurveyResult } from '../calc/survey.ts';
import { calculateLayout } from '../calc/portfolio.ts';
import type { Survey } from '../survey/model.ts';
import { demoLandlordSurveys, demoPortfolio, demoSurvey } from '../survey/demo.ts';
import { exampleCatalog } from '../survey/examples.ts';
import { makeSurveyFile } from '../survey/format.ts';
import { parseSurveyFileText, type FileProblem } from '../survey/validate.ts';
import { planUsage, runPlanCommand } from './plan.ts';

/** What the command needs from its surroundings (so tests can run it in-process). */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): Promise<string>;
  readStdin(): Promise<string>;
  /** Writes a file (the PDF commands need it). */
  writeFile?(path: string, bytes: Uint8Array): Promise<void>;
}

export const cliVersion = '0.1.0';

/** Name and version of the JSON that `lampwalk choose` prints. */
export const chooseOutputFormat = { format: 'lampwalk-product-choice', version: 1 } as const;

/** Name and version of the JSON that `lampwalk calc` prints. */
export const calcOutputFormat = { format: 'lampwalk-calc-result', version: 1 } as const;

const usage = `Usage: lampwalk <command> [options]

Commands:
  calc <file>      Calculate a survey file ("-" reads standard input) and print
                   every result as JSON: totals, economics, rooms, entries,
                   circuits and warnings (and, for a repeated layout, a
                   "layout" object with the totals of all its units).
                   --survey <id>   only the survey with this id
                   --compact       one line of JSON instead of indented
  report <file> -o <report.pdf>
                   Write the client report (PDF) of one survey.
                   --company <name>  company on the cover (default: the
                                     survey's "prepared by")
                   --date <YYYY-MM-DD>  report date (default: today)
  quote <file> -o <quote.pdf>
                   Write the contractor quote (PDF) of one survey.
                   --valid-days <N>  days the quote is valid (default 30)
                   --company <name>, --date <YYYY-MM-DD>  as for report
  orders <file>    Print the order list of one survey as CSV: proposed
                   products summed over all rooms.
                   --spare <percent>  spare stock, rounded up (default 5)
  schedule <file>  Print the fixture schedule of one survey as CSV: one row
                   per fixture entry with its computed figures.
                   report, quote, orders and schedule take --survey <id>
                   when the file holds more than one survey ("-" reads
                   standard input).
${planUsage}  choose <file>    Propose, for every fixture entry of one survey, the catalog
                   product (from the file's catalog) with the lowest life-cycle
                   cost that fits the fixture, and print it as JSON with every
                   rejected product and its reason. Changes nothing unless
                   --apply is given.
                   --survey <id>     the survey, when the file holds several
                   --apply --out <file>  write a new survey file with the
                                     proposed products applied (the input
                                     file is never changed)
                   --entry <id>      with --apply: only this entry
                                     (repeat for several)
                   --room-first      judge light by the room's target
                                     illuminance first, not per fixture
  demo             Print the demo survey as a survey file.
                   --portfolio       also the landlord demo: three unit
                                     layouts and the portfolio grouping
                                     them with the demo survey
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

/** What `calc` adds beside `totals` for a survey with a repeated layout: the figures for all its units. */
interface LayoutOutput {
  units: number;
  differingUnits: number;
  totals: SurveyResult['totals'];
  economics: SurveyResult['economics'];
  /** Fixtures of each entry across all units, by entry id. */
  fixturesByEntry: Record<string, number>;
}

function layoutOutput(survey: Parameters<typeof calculateLayout>[0], result: SurveyResult): LayoutOutput {
  const layout = calculateLayout(survey, result);
  const fixturesByEntry: Record<string, number> = Object.create(null) as Record<string, number>;
  for (const [entryId, fixtures] of layout.fixturesByEntry) fixturesByEntry[entryId] = fixtures;
  return { units: layout.units, differingUnits: layout.differingUnits, totals: layout.totals, economics: layout.economics, fixturesByEntry };
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
  const results: (SurveyResult | (SurveyResult & { layout: LayoutOutput }))[] = [];
  for (const { survey, index } of surveys) {
    try {
      const result = calculateSurvey(survey);
      results.push(survey.layout ? { ...result, layout: layoutOutput(survey, result) } : result);
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

type ExportCommand = 'report' | 'quote' | 'orders' | 'schedule';

interface ExportOptions {
  file: string;
  surveyId: string | null;
  output: string | null;
  company: string | null;
  date: Date | null;
  validDays: number | null;
  sparePercent: number | null;
}

/** Options each export command accepts (beyond the file and --survey). */
const exportFlags: Readonly<Record<ExportCommand, readonly string[]>> = {
  report: ['-o', '--output', '--company', '--date'],
  quote: ['-o', '--output', '--company', '--date', '--valid-days'],
  orders: ['--spare'],
  schedule: [],
};

function wholeNumber(flag: string, text: string, min: number, max: number): number {
  if (!/^\d+$/.test(text) || Number(text) < min || Number(text) > max) {
    throw new UsageError(`${flag} must be a whole number from ${min} to ${max} (got "${text}")`);
  }
  return Number(text);
}

function parseDate(text: string): Date {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  const date = match ? new Date(Number(match[1]), Number(match[2]) - 1, Number(match[3])) : null;
  if (!match || !date || date.getMonth() !== Number(match[2]) - 1 || date.getDate() !== Number(match[3])) {
    throw new UsageError(`--date must be a date written YYYY-MM-DD (got "${text}")`);
  }
  return date;
}

function parseExportArgs(command: ExportCommand, args: readonly string[]): ExportOptions {
  const options: ExportOptions = { file: '', surveyId: null, output: null, company: null, date: null, validDays: null, sparePercent: null };
  let file: string | null = null;
  const allowed = new Set(['--survey', ...exportFlags[command]]);
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg.startsWith('-') && arg !== '-') {
      if (!allowed.has(arg)) throw new UsageError(`unknown option ${arg} for ${command}`);
      const value = args[i + 1];
      if (value === undefined || (value.startsWith('-') && value !== '-')) throw new UsageError(`${arg} needs a value`);
      i++;
      switch (arg) {
        case '--survey':
          options.surveyId = value;
          break;
        case '-o':
        case '--output':
          options.output = value;
          break;
        case '--company':
          options.company = value;
          break;
        case '--date':
          options.date = parseDate(value);
          break;
        case '--valid-days':
          options.validDays = wholeNumber(arg, value, 1, 365);
          break;
        case '--spare':
          options.sparePercent = wholeNumber(arg, value, 0, 100);
          break;
      }
    } else if (file === null) {
      file = arg;
    } else {
      throw new UsageError(`unexpected argument "${arg}"`);
    }
  }
  if (file === null) throw new UsageError(`${command} needs a survey file (or "-" for standard input)`);
  if ((command === 'report' || command === 'quote') && options.output === null) {
    throw new UsageError(`${command} writes a PDF: name it with -o <file.pdf>`);
  }
  return { ...options, file };
}

/** Reads, validates and calculates the one survey an export command works on; null after printing problems. */
async function loadOneSurvey(io: CliIo, file: string, surveyId: string | null): Promise<{ survey: Survey; result: SurveyResult } | null> {
  const text = await readInput(io, file);
  const source = file === '-' ? 'standard input' : file;
  const parsed = parseSurveyFileText(text);
  if (!parsed.ok) {
    io.stderr(describeProblems(source, parsed.problems));
    return null;
  }
  const surveys = parsed.file.surveys.map((survey, index) => ({ survey, index }));
  let chosen = surveys;
  if (surveyId !== null) {
    chosen = surveys.filter((s) => s.survey.id === surveyId);
    if (chosen.length === 0) throw new UsageError(`no survey with id "${surveyId}" in ${source}`);
  } else if (surveys.length === 0) {
    throw new UsageError(`${source} holds no survey`);
  } else if (surveys.length > 1) {
    throw new UsageError(`${source} holds ${surveys.length} surveys; pick one with --survey <id> (${surveys.map((s) => s.survey.id).join(', ')})`);
  }
  const { survey, index } = chosen[0]!;
  try {
    return { survey, result: calculateSurvey(survey) };
  } catch (err) {
    if (err instanceof CalcInputError) {
      io.stderr(describeProblems(source, [{ path: `surveys[${index}].${err.field}`, message: err.problem }]));
      return null;
    }
    throw err;
  }
}

async function writeOutput(io: CliIo, path: string, bytes: Uint8Array): Promise<void> {
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

async function runExport(command: ExportCommand, args: readonly string[], io: CliIo): Promise<number> {
  const options = parseExportArgs(command, args);
  const loaded = await loadOneSurvey(io, options.file, options.surveyId);
  if (!loaded) return 2;
  // Loaded on demand so `calc` and `demo` never pay for jsPDF.
  const exports = await import('../export/index.ts');
  const signal = new AbortController().signal;
  const company = { companyName: options.company ?? loaded.survey.preparedBy, date: options.date ?? new Date() };
  try {
    switch (command) {
      case 'report': {
        const bytes = await exports.clientReportPdf(signal, loaded, company);
        await writeOutput(io, options.output!, bytes);
        return 0;
      }
      case 'quote': {
        const settings = options.validDays === null ? company : { ...company, validDays: options.validDays };
        const bytes = await exports.contractorQuotePdf(signal, loaded, settings);
        await writeOutput(io, options.output!, bytes);
        return 0;
      }
      case 'orders':
        io.stdout(exports.orderListCsv(loaded.survey, options.sparePercent === null ? {} : { sparePercent: options.sparePercent }));
        io.stdout('\r\n');
        return 0;
      case 'schedule':
        io.stdout(exports.fixtureScheduleCsv(loaded.survey, loaded.result));
        io.stdout('\r\n');
        return 0;
    }
  } catch (err) {
    if (err instanceof CalcInputError) throw new UsageError(`${err.field}: ${err.problem}`);
    throw err;
  }
}

interface ChooseOptions {
  file: string;
  surveyId: string | null;
  apply: boolean;
  out: string | null;
  entryIds: string[];
  roomFirst: boolean;
}

function parseChooseArgs(args: readonly string[]): ChooseOptions {
  const options: ChooseOptions = { file: '', surveyId: null, apply: false, out: null, entryIds: [], roomFirst: false };
  let file: string | null = null;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg === '--apply') options.apply = true;
    else if (arg === '--room-first') options.roomFirst = true;
    else if (arg === '--survey' || arg === '--out' || arg === '-o' || arg === '--entry') {
      const value = args[i + 1];
      if (value === undefined || (value.startsWith('-') && value !== '-')) throw new UsageError(`${arg} needs a value`);
      i++;
      if (arg === '--survey') options.surveyId = value;
      else if (arg === '--entry') options.entryIds.push(value);
      else options.out = value;
    } else if (arg.startsWith('-') && arg !== '-') {
      throw new UsageError(`unknown option ${arg} for choose`);
    } else if (file === null) {
      file = arg;
    } else {
      throw new UsageError(`unexpected argument "${arg}"`);
    }
  }
  if (file === null) throw new UsageError('choose needs a survey file (or "-" for standard input)');
  if (options.apply && options.out === null) throw new UsageError('choose --apply writes a new survey file: name it with --out <file>');
  if (!options.apply && options.out !== null) throw new UsageError('--out goes with --apply');
  if (!options.apply && options.entryIds.length > 0) throw new UsageError('--entry goes with --apply');
  if (options.out !== null && options.out === file) throw new UsageError('--out must name a new file: the input file is never changed');
  return { ...options, file };
}

/** The JSON `lampwalk choose` prints for one survey: per entry the best product, its LCC, and every rejected product with its reasons. */
function choiceJson(choice: SurveyChoice): unknown {
  return {
    surveyId: choice.surveyId,
    currency: choice.currency,
    analysisYears: choice.analysisYears,
    lightRule: choice.lightRule,
    counts: choice.counts,
    entries: choice.entries.map((e) => {
      const candidates = e.candidates;
      const current = e.current;
      return {
        entryId: e.entryId,
        roomId: e.roomId,
        roomName: e.roomName,
        description: e.description,
        count: e.count,
        changed: e.changed,
        best: e.best && { productId: e.best.productId, name: e.best.name, lifeCycleCost: e.best.lifeCycleCost, lumensPerFixture: e.best.lumensPerFixture, notes: e.best.notes.map((n) => n.message) },
        current: current && {
          productId: current.productId,
          name: current.name,
          accepted: current.accepted,
          lifeCycleCost: current.lifeCycleCost,
          reasons: current.reasons.map((r) => r.message),
        },
        alternatives: candidates.filter((c) => c.accepted && c.productId !== e.best?.productId).map((c) => ({ productId: c.productId, name: c.name, lifeCycleCost: c.lifeCycleCost })),
        rejected: candidates.filter((c) => !c.accepted).map((c) => ({ productId: c.productId, name: c.name, reasons: c.reasons.map((r) => `${r.code}: ${r.message}`) })),
      };
    }),
  };
}

async function runChoose(args: readonly string[], io: CliIo): Promise<number> {
  const options = parseChooseArgs(args);
  const text = await readInput(io, options.file);
  const source = options.file === '-' ? 'standard input' : options.file;
  const parsed = parseSurveyFileText(text);
  if (!parsed.ok) {
    io.stderr(describeProblems(source, parsed.problems));
    return 2;
  }
  const file = parsed.file;
  const surveys = file.surveys.map((survey, index) => ({ survey, index }));
  let chosen = surveys;
  if (options.surveyId !== null) {
    chosen = surveys.filter((s) => s.survey.id === options.surveyId);
    if (chosen.length === 0) throw new UsageError(`no survey with id "${options.surveyId}" in ${source}`);
  } else if (surveys.length === 0) {
    throw new UsageError(`${source} holds no survey`);
  } else if (surveys.length > 1) {
    throw new UsageError(`${source} holds ${surveys.length} surveys; pick one with --survey <id> (${surveys.map((s) => s.survey.id).join(', ')})`);
  }
  const { survey, index } = chosen[0]!;
  if (file.catalog.length === 0) throw new UsageError(`${source} holds no catalog products to choose from`);
  let choice: SurveyChoice;
  try {
    choice = chooseProducts(survey, file.catalog, { lightRule: options.roomFirst ? 'room-first' : 'fixture-first' });
  } catch (err) {
    if (err instanceof CalcInputError) {
      io.stderr(describeProblems(source, [{ path: `surveys[${index}].${err.field}`, message: err.problem }]));
      return 2;
    }
    throw err;
  }
  io.stdout(`${JSON.stringify({ ...chooseOutputFormat, generatedBy: `lampwalk ${cliVersion}`, ...(choiceJson(choice) as object) }, null, 2)}\n`);
  if (options.apply) {
    const known = new Set(choice.entries.map((e) => e.entryId));
    for (const id of options.entryIds) if (!known.has(id)) throw new UsageError(`no entry with id "${id}" in survey "${survey.id}"`);
    const ids = options.entryIds.length > 0 ? options.entryIds : choice.entries.filter((e) => e.changed).map((e) => e.entryId);
    const applied = applyChoices(survey, choice, ids);
    const surveysOut = file.surveys.map((s, i) => (i === index ? applied : s));
    const out = makeSurveyFile(surveysOut, file.catalog, new Date(), file.photos, file.portfolios);
    await writeOutput(io, options.out!, new TextEncoder().encode(`${JSON.stringify(out, null, 2)}\n`));
    const changed = ids.filter((id) => choice.entries.find((e) => e.entryId === id)?.best).length;
    io.stderr(`lampwalk: wrote ${options.out} with ${changed} entr${changed === 1 ? 'y' : 'ies'} changed; ${source} is unchanged.\n`);
  }
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
      case 'report':
      case 'quote':
      case 'orders':
      case 'schedule':
        return await runExport(command, rest, io);
      case 'plan':
      case 'summary':
      case 'phase-orders':
        return await runPlanCommand(command, rest, io, cliVersion);
      case 'choose':
        return await runChoose(rest, io);
      case 'demo': {
        const withPortfolio = rest.length === 1 && rest[0] === '--portfolio';
        if (rest.length > 0 && !withPortfolio) throw new UsageError(`demo takes only --portfolio (got "${rest.join(' ')}")`);
        const file = withPortfolio
          ? makeSurveyFile([demoSurvey(), ...demoLandlordSurveys()], [...exampleCatalog], new Date(), [], [demoPortfolio()])
          : makeSurveyFile([demoSurvey()], [...exampleCatalog], new Date());
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
