/**
 * Unit conversions and number formatting at the edges. Everything inside the
 * engine is SI (m, m², lux, W, kWh); imperial exists only for display and
 * entry. The foot is defined exactly as 0.3048 m (international yard and
 * pound agreement, 1959), so every factor below is exact or derived from it.
 */
import type { UnitsSystem } from '../survey/model.ts';
import { CalcInputError } from './errors.ts';

/** Metres in one foot (exact). */
export const metresPerFoot = 0.3048;
/** Square metres in one square foot (exact: 0.3048²). */
export const squareMetresPerSquareFoot = metresPerFoot * metresPerFoot;
/** Lux in one footcandle (1 lm/ft² = 1 / 0.09290304 lm/m² ≈ 10.7639). */
export const luxPerFootcandle = 1 / squareMetresPerSquareFoot;
/** Kilograms in one avoirdupois pound (exact). */
export const kilogramsPerPound = 0.45359237;
/** Hours in a (non-leap) year. */
export const hoursInYear = 8760;
/** Mean weeks in a year (365 / 7). */
export const weeksPerYear = 365 / 7;

/** @example feetToMetres(10) //=> 3.048 */
export function feetToMetres(feet: number): number {
  return feet * metresPerFoot;
}

/** @example metresToFeet(3.048) //=> 10 */
export function metresToFeet(metres: number): number {
  return metres / metresPerFoot;
}

/** @example squareFeetToSquareMetres(1000) //=> 92.90304 */
export function squareFeetToSquareMetres(squareFeet: number): number {
  return squareFeet * squareMetresPerSquareFoot;
}

/** @example squareMetresToSquareFeet(92.90304) //=> 1000 */
export function squareMetresToSquareFeet(squareMetres: number): number {
  return squareMetres / squareMetresPerSquareFoot;
}

/** @example footcandlesToLux(50) //=> 538.195… */
export function footcandlesToLux(footcandles: number): number {
  return footcandles * luxPerFootcandle;
}

/** @example luxToFootcandles(538.19552) //=> 50.0000… */
export function luxToFootcandles(lux: number): number {
  return lux / luxPerFootcandle;
}

/** W/ft² to W/m². @example wattsPerSquareFootToWattsPerSquareMetre(1) //=> 10.7639… */
export function wattsPerSquareFootToWattsPerSquareMetre(wattsPerSquareFoot: number): number {
  return wattsPerSquareFoot / squareMetresPerSquareFoot;
}

/** W/m² to W/ft². @example wattsPerSquareMetreToWattsPerSquareFoot(10.7639104) //=> 1.0000… */
export function wattsPerSquareMetreToWattsPerSquareFoot(wattsPerSquareMetre: number): number {
  return wattsPerSquareMetre * squareMetresPerSquareFoot;
}

/** @example poundsToKilograms(1000) //=> 453.59237 */
export function poundsToKilograms(pounds: number): number {
  return pounds * kilogramsPerPound;
}

/** A physical quantity the screens and reports show in the survey's units system. */
export type DisplayQuantity = 'length' | 'area' | 'illuminance' | 'powerDensity';

/** Unit symbols per quantity and system. */
export const displayUnits: Readonly<Record<DisplayQuantity, Readonly<Record<UnitsSystem, string>>>> = {
  length: { si: 'm', imperial: 'ft' },
  area: { si: 'm²', imperial: 'ft²' },
  illuminance: { si: 'lx', imperial: 'fc' },
  powerDensity: { si: 'W/m²', imperial: 'W/ft²' },
};

/**
 * Converts an SI value (m, m², lux, W/m²) to the survey's display system.
 *
 * @example toDisplay('area', 92.90304, 'imperial') //=> 1000
 */
export function toDisplay(quantity: DisplayQuantity, siValue: number, units: UnitsSystem): number {
  if (units === 'si') return siValue;
  switch (quantity) {
    case 'length':
      return metresToFeet(siValue);
    case 'area':
      return squareMetresToSquareFeet(siValue);
    case 'illuminance':
      return luxToFootcandles(siValue);
    case 'powerDensity':
      return wattsPerSquareMetreToWattsPerSquareFoot(siValue);
  }
}

/**
 * Converts a value typed in the survey's display system back to SI for storage.
 *
 * @example fromDisplay('length', 10, 'imperial') //=> 3.048
 */
export function fromDisplay(quantity: DisplayQuantity, displayValue: number, units: UnitsSystem): number {
  if (units === 'si') return displayValue;
  switch (quantity) {
    case 'length':
      return feetToMetres(displayValue);
    case 'area':
      return squareFeetToSquareMetres(displayValue);
    case 'illuminance':
      return footcandlesToLux(displayValue);
    case 'powerDensity':
      return wattsPerSquareFootToWattsPerSquareMetre(displayValue);
  }
}

/** One separator then exactly three digits ("1,500", "2.250"): thousands to some readers, a decimal to others. */
const ambiguousThousands = /^-?[1-9]\d{0,2}[.,]\d{3}$/;
/** Digit groups of three after separators ("1,500,000", "1.500,5", "1 500"), with an optional decimal part. */
const groupedThousands = /^-?[1-9]\d{0,2}(?:([.,' \u00a0\u202f])\d{3})(?:\1\d{3})*(?:[.,]\d+)?$/;

/**
 * Says why `text` cannot be read without guessing which separator marks
 * thousands, or returns null when it has no such problem. "1,500" could be
 * 1500 or 1.5; "1.500,5" and "1,500,000" group thousands.
 *
 * @example thousandsProblem('1,500') //=> '"1,500" could be 1500 or 1.5: for 1500, type it with no separator; for 1.5, type 1.5'
 */
export function thousandsProblem(text: string): string | null {
  const trimmed = text.trim().replace(/\u2212/g, '-');
  if (ambiguousThousands.test(trimmed)) {
    const whole = trimmed.replace(/[.,]/, '');
    const decimal = trimmed.replace(',', '.').replace(/0+$/, '').replace(/\.$/, '');
    return `"${trimmed}" could be ${whole} or ${decimal}: for ${whole}, type it with no separator; for ${decimal}, type ${decimal}`;
  }
  const grouped = groupedThousands.exec(trimmed);
  if (grouped) {
    const groupSeparator = grouped[1]!;
    const [whole, fraction] = trimmed.split(groupSeparator).join('').split(/[.,]/);
    const plain = fraction === undefined ? whole : `${whole}.${fraction}`;
    return `"${trimmed}" is not a number as written: it groups thousands; write ${plain} without separators`;
  }
  return null;
}

/**
 * Parses a number typed on a phone keyboard: accepts a decimal point or a
 * decimal comma ("1.5", "1,5"), surrounding spaces, and a leading minus.
 * Thousands separators are refused because "1,500" is ambiguous between
 * locales ({@link thousandsProblem} gives the message); the caller shows the
 * message next to the field. With `decimalSeparator` (a file that declares
 * its separator) only that separator is read and nothing is ambiguous.
 *
 * @example parseDecimal('1,5', 'count') //=> 1.5
 * @example parseDecimal('1,500', 'count') // throws 'count: "1,500" could be 1500 or 1.5: …'
 */
export function parseDecimal(text: string, field: string, decimalSeparator?: '.' | ','): number {
  const trimmed = text.trim().replace(/\u2212/g, '-');
  if (trimmed === '') throw new CalcInputError(field, 'is empty; enter a number');
  const pattern =
    decimalSeparator === undefined ? /^-?(\d+([.,]\d*)?|[.,]\d+)$/ : decimalSeparator === '.' ? /^-?(\d+(\.\d*)?|\.\d+)$/ : /^-?(\d+(,\d*)?|,\d+)$/;
  const separators = decimalSeparator === undefined ? 'one "." or ","' : `one "${decimalSeparator}"`;
  if (decimalSeparator === undefined) {
    const thousands = thousandsProblem(text);
    if (thousands !== null) throw new CalcInputError(field, thousands);
  }
  if (!pattern.test(trimmed)) {
    const thousands = thousandsProblem(text);
    if (thousands !== null) throw new CalcInputError(field, thousands);
    throw new CalcInputError(field, `"${text}" is not a number; use digits with ${separators} for decimals`);
  }
  const value = Number(trimmed.replace(',', '.'));
  if (!Number.isFinite(value)) throw new CalcInputError(field, `"${text}" is out of range`);
  return value;
}

const formatters = new Map<string, Intl.NumberFormat>();

function cachedFormat(locale: string, options: Intl.NumberFormatOptions): Intl.NumberFormat {
  const key = `${locale}|${JSON.stringify(options)}`;
  let format = formatters.get(key);
  if (!format) {
    format = new Intl.NumberFormat(locale, options);
    formatters.set(key, format);
  }
  return format;
}

/** True when `code` is an ISO 4217 currency code known to this runtime's `Intl`. */
export function isKnownCurrency(code: string): boolean {
  if (!/^[A-Z]{3}$/.test(code)) return false;
  const supported = (Intl as { supportedValuesOf?: (key: 'currency') => string[] }).supportedValuesOf;
  return supported ? supported('currency').includes(code) : true;
}

/**
 * Formats money in the survey's currency through `Intl`.
 *
 * @example formatMoney(1234.5, 'EUR', 'de-DE') //=> '1.234,50 €'
 */
export function formatMoney(amount: number, currency: string, locale: string, fractionDigits = 2): string {
  if (!isKnownCurrency(currency)) throw new CalcInputError('currency', `"${currency}" is not an ISO 4217 currency code`);
  return cachedFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: fractionDigits,
    maximumFractionDigits: fractionDigits,
  }).format(amount);
}

/** Formats a plain number with a fixed count of decimals for the locale. */
export function formatNumber(value: number, locale: string, fractionDigits = 0): string {
  return cachedFormat(locale, {
    minimumFractionDigits: fractionDigits,
    maximumFractionDigits: fractionDigits,
  }).format(value);
}
