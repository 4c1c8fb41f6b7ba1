/**
 * How the documents write figures: one formatter set per survey (its locale,
 * currency and units system), shared by the report, the quote, the order
 * page and their tests, so a test can format a calculation result exactly as
 * the PDF prints it.
 */
import type { IrrResult } from '../calc/economics.ts';
import type { RoomResult, SurveyResult } from '../calc/survey.ts';
import { displayUnits, formatMoney, formatNumber, toDisplay, type DisplayQuantity } from '../calc/units.ts';
import { warningThresholds } from '../calc/warnings.ts';
import type { Survey, UnitsSystem } from '../survey/model.ts';
import { isWinAnsi } from './text.ts';

/** Formatters bound to one survey's locale, currency and units system. */
export interface Figures {
  locale: string;
  currency: string;
  units: UnitsSystem;
  /** Money with cents, e.g. "$1,234.50". */
  money(amount: number): string;
  /** Money rounded to whole units, e.g. "$1,235" (chart axes, headline figures). */
  moneyWhole(amount: number): string;
  /** A plain number with `digits` decimals in the survey's locale. */
  number(value: number, digits?: number): string;
  /** e.g. "12,345 kWh". */
  kwh(value: number): string;
  /** e.g. "1.23 kW". */
  kw(value: number): string;
  /** e.g. "113.0 W". */
  watts(value: number, digits?: number): string;
  /** A fraction as a percentage, e.g. 0.0725 → "7.3 %". */
  percent(fraction: number, digits?: number): string;
  /** Simple payback in years, or a phrase when there is none. */
  payback(years: number | null): string;
  /** Simple payback for narrow table cells: "0.9 yr", "now" or "none". */
  paybackShort(years: number | null): string;
  /** The IRR outcome in words: one rate, several, or none (with the reason). */
  irr(irr: IrrResult): string;
  /** CO2 in kg, or tonnes from 1,000 kg. */
  co2(kg: number): string;
  /** An SI quantity in the survey's units with its symbol, e.g. 538 lux → "50.0 fc". */
  quantity(quantity: DisplayQuantity, siValue: number): string;
  /** The unit symbol of a quantity in the survey's units, e.g. "fc". */
  unit(quantity: DisplayQuantity): string;
  /** A long date in the survey's locale, e.g. "November 18, 2026". */
  date(date: Date): string;
}

/** Decimals shown per display quantity and system. */
const quantityDigits: Readonly<Record<DisplayQuantity, Readonly<Record<UnitsSystem, number>>>> = {
  length: { si: 2, imperial: 1 },
  area: { si: 1, imperial: 0 },
  illuminance: { si: 0, imperial: 1 },
  powerDensity: { si: 2, imperial: 2 },
};

function printable(text: string): boolean {
  for (const char of text) {
    const code = char.codePointAt(0) ?? 0;
    // Special spaces are mapped to WinAnsi spaces by pdfSafeText; anything else must already be WinAnsi.
    if (!isWinAnsi(code) && !(code >= 0x2000 && code <= 0x200a) && code !== 0x202f) return false;
  }
  return true;
}

/**
 * The formatters for a survey. Money goes through `formatMoney` (Intl, the
 * survey's currency); when the currency symbol cannot be printed with the
 * PDF fonts (₹, ₩, zł…) the ISO code is written instead ("INR 1,234.50").
 *
 * @example figuresFor(demoSurvey()).money(1234.5) //=> '$1,234.50'
 */
export function figuresFor(survey: Pick<Survey, 'locale' | 'units'> & { money: { currency: string } }): Figures {
  const locale = survey.locale;
  const currency = survey.money.currency;
  const units = survey.units;
  const moneyWith = (amount: number, digits: number): string => {
    const text = formatMoney(amount, currency, locale, digits);
    if (printable(text)) return text;
    return new Intl.NumberFormat(locale, {
      style: 'currency',
      currency,
      currencyDisplay: 'code',
      minimumFractionDigits: digits,
      maximumFractionDigits: digits,
    }).format(amount);
  };
  const number = (value: number, digits = 0) => formatNumber(value, locale, digits);
  const dateFormat = new Intl.DateTimeFormat(locale, { dateStyle: 'long' });
  const figures: Figures = {
    locale,
    currency,
    units,
    money: (amount) => moneyWith(amount, 2),
    moneyWhole: (amount) => moneyWith(amount, 0),
    number,
    kwh: (value) => `${number(value, 0)} kWh`,
    kw: (value) => `${number(value, 2)} kW`,
    watts: (value, digits = 1) => `${number(value, digits)} W`,
    percent: (fraction, digits = 1) => `${number(fraction * 100, digits)} %`,
    payback: (years) =>
      years === null ? 'not repaid by the savings' : years === 0 ? 'immediate (rebates cover the cost)' : `${number(years, 1)} years`,
    paybackShort: (years) => (years === null ? 'none' : years === 0 ? 'now' : `${number(years, 1)} yr`),
    irr: (irr) => {
      switch (irr.kind) {
        case 'unique':
          return figures.percent(irr.ratePerYear);
        case 'multiple':
          return `several rates (${irr.ratesPerYear.map((r) => figures.percent(r)).join(', ')}); judge by NPV instead`;
        case 'none':
          return `none: ${irr.reason}`;
      }
    },
    co2: (kg) => (Math.abs(kg) >= 1000 ? `${number(kg / 1000, 2)} t CO2` : `${number(kg, 0)} kg CO2`),
    quantity: (quantity, siValue) => `${number(toDisplay(quantity, siValue, units), quantityDigits[quantity][units])} ${displayUnits[quantity][units]}`,
    unit: (quantity) => displayUnits[quantity][units],
    date: (date) => dateFormat.format(date),
  };
  return figures;
}

/** How a room's estimated light level compares with its target. */
export type LightVerdict = 'short' | 'ok' | 'over' | 'unknown' | 'no-proposal';

/**
 * Judges a room's proposed maintained illuminance against its target with
 * the warning thresholds (under 80 % short, over 150 % well above).
 *
 * @example lightVerdict(room) //=> 'ok'
 */
export function lightVerdict(room: RoomResult): LightVerdict {
  if (!room.entries.some((e) => e.proposedName !== null)) return 'no-proposal';
  const { proposedLux, targetLux } = room.adequacy;
  if (proposedLux === null || targetLux <= 0) return 'unknown';
  const ratio = proposedLux / targetLux;
  if (ratio < warningThresholds.illuminanceShortFraction) return 'short';
  if (ratio > warningThresholds.illuminanceOverFraction) return 'over';
  return 'ok';
}

function roomList(rooms: readonly RoomResult[], limit = 3): string {
  const names = rooms.slice(0, limit).map((r) => r.name);
  const more = rooms.length - names.length;
  return more > 0 ? `${names.join(', ')} and ${more} more` : names.join(', ');
}

function roomsWord(n: number): string {
  return n === 1 ? '1 room' : `${n} rooms`;
}

/**
 * One or two sentences on light quality after the swap, from each room's
 * estimated light level against its target.
 *
 * @example lightQualitySentence(calculateSurvey(demoSurvey()))
 * //=> 'Of the 6 rooms with a proposal, 4 reach their recommended light level (80–150 % of target) …'
 */
export function lightQualitySentence(result: SurveyResult): string {
  const by: Record<LightVerdict, RoomResult[]> = { short: [], ok: [], over: [], unknown: [], 'no-proposal': [] };
  for (const room of result.rooms) by[lightVerdict(room)].push(room);
  const proposed = result.rooms.length - by['no-proposal'].length;
  if (proposed === 0) return 'No room has a proposal yet, so light quality after the swap is not assessed.';
  const low = Math.round(warningThresholds.illuminanceShortFraction * 100);
  const high = Math.round(warningThresholds.illuminanceOverFraction * 100);
  const parts = [`Of the ${roomsWord(proposed)} with a proposal, ${by.ok.length} reach their recommended light level (${low}–${high} % of target)`];
  if (by.short.length > 0) parts.push(`${by.short.length} fall${by.short.length === 1 ? 's' : ''} short (${roomList(by.short)})`);
  if (by.over.length > 0) parts.push(`${by.over.length} ${by.over.length === 1 ? 'is' : 'are'} well above it (${roomList(by.over)})`);
  let sentence = parts.length === 1 ? `${parts[0]}.` : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}.`;
  if (by.unknown.length > 0) {
    sentence += ` The level in ${roomsWord(by.unknown.length)} (${roomList(by.unknown)}) is not estimated because some lumen figures are missing.`;
  }
  return sentence;
}
