/**
 * The portfolio commands of `lampwalk` (run from `main.ts`):
 *
 *   lampwalk plan <file> --budget <amount> --years <n>   the phased plan as JSON
 *   lampwalk summary <file> -o <summary.pdf>             the portfolio summary PDF
 *   lampwalk phase-orders <file>                         the order list by phase (CSV, or PDF with -o)
 *
 * Each works on the surveys of the portfolio named by --portfolio <id>, or on
 * every survey in the file when none is named. --budget and --years default
 * to the named portfolio's plan settings. Exit codes as for every command:
 * 0 done, 2 bad input or usage, 1 unexpected failure.
 */
import { CalcInputError } from '../calc/errors.ts';
import { maxMoneyAmount } from '../calc/economics.ts';
import { maxPlanYears, measuresFromSurveys, planPhases, type Measure, type PlanOptions } from '../calc/phasing.ts';
import type { PhasePlanSettings, Portfolio, Survey } from '../survey/model.ts';
import { parseSurveyFileText } from '../survey/validate.ts';
import { describeProblems, parseCommandLine, parseDate, readInput, sourceName, UsageError, wholeNumber, writeOutput, type CliIo } from './args.ts';

/** What the commands need from their surroundings: `main.ts`'s `CliIo`. */
export type PlanCliIo = CliIo;

/** The portfolio commands. */
export type PlanCommand = 'plan' | 'summary' | 'phase-orders';

/** Name and version of the JSON that `lampwalk plan` prints. */
export const planOutputFormat = { format: 'lampwalk-phase-plan', version: 1 } as const;

/** Usage lines for `lampwalk help`. */
export const planUsage = `  plan <file> --budget <amount> --years <n>
                   Plan which measures to do in which year to maximise NPV
                   within a yearly budget; print the plan as JSON.
                   --portfolio <id>  only that portfolio's surveys (its plan
                                     settings are the default budget and years);
                                     without it, every survey in the file
                   --method auto|exact|heuristic   (default auto)
                   --compact         one line of JSON
  summary <file> -o <summary.pdf>
                   Write the portfolio summary (PDF): totals, sites compared,
                   the phased plan and why measures wait. Takes --portfolio,
                   --budget, --years, --method as plan, and --company <name>,
                   --date <YYYY-MM-DD>.
  phase-orders <file>
                   Print the order list by plan year as CSV (-o <file.pdf>
                   writes it as a PDF instead). Takes --portfolio, --budget,
                   --years, --method as plan, and --spare <percent>.
`;

interface PlanArgs {
  file: string;
  portfolioId: string | null;
  budget: number | null;
  years: number | null;
  method: NonNullable<PlanOptions['method']>;
  compact: boolean;
  output: string | null;
  company: string | null;
  date: Date | null;
  sparePercent: number | null;
}

const flagsOf: Readonly<Record<PlanCommand, readonly string[]>> = {
  plan: ['--portfolio', '--budget', '--years', '--method', '--compact'],
  summary: ['--portfolio', '--budget', '--years', '--method', '-o', '--output', '--company', '--date'],
  'phase-orders': ['--portfolio', '--budget', '--years', '--method', '--spare', '-o', '--output', '--company', '--date'],
};

function parseBudget(text: string): number {
  const value = /^\d+(\.\d+)?$/.test(text) ? Number(text) : Number.NaN;
  if (!Number.isFinite(value) || value > maxMoneyAmount) {
    throw new UsageError(`--budget must be an amount of 0 or more, digits with an optional decimal point, no currency sign or thousands separator (got "${text}")`);
  }
  return value;
}

function parseArgs(command: PlanCommand, args: readonly string[]): PlanArgs {
  const out: PlanArgs = {
    file: '',
    portfolioId: null,
    budget: null,
    years: null,
    method: 'auto',
    compact: false,
    output: null,
    company: null,
    date: null,
    sparePercent: null,
  };
  const file = parseCommandLine(
    command,
    args,
    flagsOf[command],
    (arg, value) => {
      switch (arg) {
        case '--portfolio':
          out.portfolioId = value;
          break;
        case '--budget':
          out.budget = parseBudget(value);
          break;
        case '--years':
          out.years = wholeNumber(arg, value, 1, maxPlanYears);
          break;
        case '--method':
          if (value !== 'auto' && value !== 'exact' && value !== 'heuristic') {
            throw new UsageError(`--method must be auto, exact or heuristic (got "${value}")`);
          }
          out.method = value;
          break;
        case '-o':
        case '--output':
          out.output = value;
          break;
        case '--company':
          out.company = value;
          break;
        case '--date':
          out.date = parseDate(value);
          break;
        case '--spare':
          out.sparePercent = wholeNumber(arg, value, 0, 100);
          break;
      }
    },
    (arg) => {
      if (arg !== '--compact') return false;
      out.compact = true;
      return true;
    },
  );
  if (command === 'summary' && out.output === null) throw new UsageError('summary writes a PDF: name it with -o <file.pdf>');
  return { ...out, file };
}

interface Loaded {
  source: string;
  portfolio: Portfolio | null;
  surveys: Survey[];
  /** Index of each chosen survey in the file, for error paths. */
  fileIndex: number[];
  settings: PhasePlanSettings;
  measures: Measure[];
}

/** Reads the file and picks the surveys and settings; null after printing the file's problems. */
async function load(io: PlanCliIo, args: PlanArgs): Promise<Loaded | null> {
  const source = sourceName(args.file);
  const parsed = parseSurveyFileText(await readInput(io, args.file));
  if (!parsed.ok) {
    io.stderr(describeProblems(source, parsed.problems));
    return null;
  }
  const file = parsed.file;
  let portfolio: Portfolio | null = null;
  let chosen: { survey: Survey; index: number }[];
  if (args.portfolioId !== null) {
    portfolio = file.portfolios.find((p) => p.id === args.portfolioId) ?? null;
    if (!portfolio) {
      const known = file.portfolios.map((p) => p.id);
      throw new UsageError(`no portfolio with id "${args.portfolioId}" in ${source}${known.length ? ` (it has ${known.join(', ')})` : ' (it has none)'}`);
    }
    chosen = portfolio.surveyIds.map((id, i) => {
      const index = file.surveys.findIndex((s) => s.id === id);
      if (index < 0) throw new UsageError(`portfolio "${portfolio!.id}" lists survey "${id}" (surveyIds[${i}]), which is not in ${source}`);
      return { survey: file.surveys[index]!, index };
    });
  } else {
    chosen = file.surveys.map((survey, index) => ({ survey, index }));
  }
  if (chosen.length === 0) throw new UsageError(`${source} holds no survey to plan`);
  const budget = args.budget ?? portfolio?.plan.budgetPerYear ?? null;
  const years = args.years ?? portfolio?.plan.years ?? null;
  if (budget === null || years === null) {
    throw new UsageError('give the plan --budget <amount per year> and --years <n> (or --portfolio <id> whose plan settings hold them)');
  }
  const surveys = chosen.map((c) => c.survey);
  const fileIndex = chosen.map((c) => c.index);
  let measures: Measure[];
  try {
    measures = measuresFromSurveys(surveys);
  } catch (err) {
    if (err instanceof CalcInputError) {
      const path = err.field.replace(/^surveys\[(\d+)\]/, (_, i: string) => `surveys[${fileIndex[Number(i)] ?? i}]`);
      io.stderr(describeProblems(source, [{ path, message: err.problem }]));
      return null;
    }
    throw err;
  }
  return { source, portfolio, surveys, fileIndex, settings: { budgetPerYear: budget, years }, measures };
}

/** A portfolio for the documents when the file names none: every survey chosen. */
function impliedPortfolio(loaded: Loaded): Portfolio {
  const first = loaded.surveys[0]!;
  const stamp = new Date(0).toISOString();
  return {
    id: 'all-surveys',
    name: loaded.surveys.length === 1 ? first.name : `${first.name} and ${loaded.surveys.length - 1} more`,
    client: first.client,
    surveyIds: loaded.surveys.map((s) => s.id),
    plan: loaded.settings,
    notes: '',
    createdAt: stamp,
    updatedAt: stamp,
  };
}

/**
 * Runs `plan`, `summary` or `phase-orders` and returns the exit code; prints
 * usage problems itself (exit 2), as `main` does for the other commands.
 *
 * @example await runPlanCommand('plan', ['estate.json', '--budget', '20000', '--years', '3'], io) //=> 0, the plan as JSON on stdout
 */
export async function runPlanCommand(command: PlanCommand, rest: readonly string[], io: PlanCliIo, version: string): Promise<number> {
  try {
    const args = parseArgs(command, rest);
    const loaded = await load(io, args);
    if (!loaded) return 2;
    const first = loaded.surveys[0]!;
    const options: PlanOptions = { method: args.method, locale: first.locale, currency: first.money.currency };
    try {
      if (command === 'plan') {
        const plan = planPhases(loaded.measures, loaded.settings, options);
        const output = {
          ...planOutputFormat,
          generatedBy: `lampwalk ${version}`,
          portfolio: loaded.portfolio ? { id: loaded.portfolio.id, name: loaded.portfolio.name } : null,
          currency: first.money.currency,
          surveys: loaded.surveys.map((s) => ({ id: s.id, name: s.name })),
          measures: loaded.measures,
          plan,
        };
        io.stdout(`${JSON.stringify(output, null, args.compact ? undefined : 2)}\n`);
        return 0;
      }
      // Loaded on demand so `plan` never pays for jsPDF.
      const exports = await import('../export/index.ts');
      const portfolio = loaded.portfolio ?? impliedPortfolio(loaded);
      const input = exports.preparePortfolioExport(portfolio, loaded.surveys, loaded.settings, options);
      const signal = new AbortController().signal;
      const company = { companyName: args.company ?? first.preparedBy, date: args.date ?? new Date() };
      if (command === 'summary') {
        await writeOutput(io, args.output!, await exports.portfolioSummaryPdf(signal, input, company));
        return 0;
      }
      const spare = args.sparePercent === null ? {} : { sparePercent: args.sparePercent };
      if (args.output !== null) {
        await writeOutput(io, args.output, await exports.phaseOrderPdf(signal, input, { ...company, ...spare }));
      } else {
        io.stdout(exports.phaseOrderCsv(input, spare));
        io.stdout('\r\n');
      }
      return 0;
    } catch (err) {
      if (err instanceof CalcInputError) throw new UsageError(`${err.field}: ${err.problem}`);
      throw err;
    }
  } catch (err) {
    if (err instanceof UsageError) {
      io.stderr(`lampwalk: ${err.message}\nRun "lampwalk help" for usage.\n`);
      return 2;
    }
    throw err;
  }
}
