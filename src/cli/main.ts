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
import { parseSurveyFileText } from '../survey/validate.ts';
import {
  describeProblems,
  parseCommandLine,
  parseDate,
  pickOneSurvey,
  readInput,
  sourceName,
  UsageError,
  wholeNumber,
  writeOutput,
  type CliIo,
} from './args.ts';
import { planUsage, runPlanCommand } from './plan.ts';

export type { CliIo };

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
    io.stderr(describeProblems(sourceName(options.file), parsed.problems));
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

function parseExportArgs(command: ExportCommand, args: readonly string[]): ExportOptions {
  const options: ExportOptions = { file: '', surveyId: null, output: null, company: null, date: null, validDays: null, sparePercent: null };
  const file = parseCommandLine(command, args, ['--survey', ...exportFlags[command]], (arg, value) => {
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
  });
  if ((command === 'report' || command === 'quote') && options.output === null) {
    throw new UsageError(`${command} writes a PDF: name it with -o <file.pdf>`);
  }
  return { ...options, file };
}

/** Reads, validates and calculates the one survey an export command works on; null after printing problems. */
async function loadOneSurvey(io: CliIo, file: string, surveyId: string | null): Promise<{ survey: Survey; result: SurveyResult } | null> {
  const text = await readInput(io, file);
  const source = sourceName(file);
  const parsed = parseSurveyFileText(text);
  if (!parsed.ok) {
    io.stderr(describeProblems(source, parsed.problems));
    return null;
  }
  const { survey, index } = pickOneSurvey(parsed.file.surveys, surveyId, source);
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
  const file = parseCommandLine(
    'choose',
    args,
    ['--apply', '--room-first', '--survey', '--out', '-o', '--entry'],
    (arg, value) => {
      if (arg === '--survey') options.surveyId = value;
      else if (arg === '--entry') options.entryIds.push(value);
      else options.out = value;
    },
    (arg) => {
      if (arg === '--apply') options.apply = true;
      else if (arg === '--room-first') options.roomFirst = true;
      else return false;
      return true;
    },
  );
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
  const source = sourceName(options.file);
  const parsed = parseSurveyFileText(text);
  if (!parsed.ok) {
    io.stderr(describeProblems(source, parsed.problems));
    return 2;
  }
  const file = parsed.file;
  const { survey, index } = pickOneSurvey(file.surveys, options.surveyId, source);
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
