/**
 * Reading numbers typed into fields: "1.5" and "1,5" both work
 * (`parseDecimal`), and every failure is a message for beside the field, so
 * nothing out of range reaches the store or the calculation.
 */
import { CalcInputError } from '../../calc/errors.ts';
import { parseDecimal, thousandsProblem } from '../../calc/units.ts';

/** What a number field accepts. Limits are in the units the field shows. */
export interface NumberRule {
  min: number;
  max: number;
  /** Whole numbers only. */
  integer?: boolean;
  /** The minimum itself is refused. */
  minExclusive?: boolean;
  /** Empty is allowed and means "not given" (the default applies). */
  optional?: boolean;
}

/** The outcome of reading a field; `note`, when present, says how the number was read. */
export type FieldReading = { ok: true; value: number | undefined; note?: string } | { ok: false; message: string };

function limit(value: number): string {
  return new Intl.NumberFormat('en-US', { maximumFractionDigits: 3 }).format(value);
}

/** A message from the calculation's number reader, as a sentence for beside the field. */
function sentence(problem: string): string {
  const text = problem.replace(/"([^"]*)"/g, '“$1”');
  return `${text.charAt(0).toUpperCase()}${text.slice(1)}.`;
}

/**
 * Reads a typed number against its rule. Thousands separators are refused
 * ("1,500" could be 1500 or 1.5), with a message saying what to type.
 *
 * @example readNumber('1,5', { min: 0, max: 10 }) //=> { ok: true, value: 1.5 }
 * @example readNumber('1,500', { min: 0, max: 10_000 }) //=> { ok: false, message: '“1,500” could be 1500 or 1.5: for 1500, type it with no separator; for 1.5, type 1.5.' }
 */
export function readNumber(text: string, rule: NumberRule): FieldReading {
  if (text.trim() === '') {
    return rule.optional ? { ok: true, value: undefined } : { ok: false, message: 'Enter a number.' };
  }
  const thousands = thousandsProblem(text);
  if (thousands !== null) return { ok: false, message: sentence(thousands) };
  let value: number;
  try {
    value = parseDecimal(text, 'value');
  } catch (error) {
    if (error instanceof CalcInputError) {
      return { ok: false, message: `“${text.trim()}” is not a number. Use digits, with “.” or “,” for decimals and no thousands separator.` };
    }
    throw error;
  }
  if (rule.integer && !Number.isInteger(value)) return { ok: false, message: 'Enter a whole number.' };
  const low = rule.minExclusive ? value <= rule.min : value < rule.min;
  if (low || value > rule.max) {
    const range = rule.minExclusive ? `more than ${limit(rule.min)} and at most ${limit(rule.max)}` : `between ${limit(rule.min)} and ${limit(rule.max)}`;
    return { ok: false, message: `Must be ${range}.` };
  }
  return { ok: true, value };
}

/** Ranges shared by the screens (the same limits as the survey file and the calculation). */
export const rules = {
  count: { min: 0, max: 100_000, integer: true },
  lampsPerFixture: { min: 1, max: 24, integer: true },
  ratedWatts: { min: 0, max: 100_000, minExclusive: true },
  optionalWatts: { min: 0, max: 100_000, optional: true },
  optionalLumens: { min: 0, max: 1e7, optional: true },
  lumens: { min: 0, max: 1e7 },
  ballastYear: { min: 1900, max: 2100, integer: true, optional: true },
  circuitVolts: { min: 12, max: 1000 },
  breakerAmps: { min: 1, max: 1000, optional: true },
  cct: { min: 1000, max: 10_000 },
  cri: { min: 0, max: 100 },
  powerFactor: { min: 0.1, max: 1 },
  lifeHours: { min: 1, max: 1_000_000 },
  money: { min: 0, max: 1e9 },
  installMinutes: { min: 0, max: 6000 },
  hoursPerYear: { min: 0, max: 8760 },
  hoursPerDay: { min: 0, max: 24 },
  weeksPerYear: { min: 1, max: 53, optional: true },
  controlFraction: { min: 0, max: 0.9, optional: true },
} as const satisfies Record<string, NumberRule>;
