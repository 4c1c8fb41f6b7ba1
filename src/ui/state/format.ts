/**
 * How the screens write figures: one set of formatters per survey (its
 * locale, currency and units system). Pure, so the browser tests can format a
 * calculation result exactly as the screen shows it and compare. A value that
 * is not a finite number is written as "—", never "NaN".
 */
import type { IrrResult } from '../../calc/economics.ts';
import { displayUnits, formatMoney, formatNumber, toDisplay, type DisplayQuantity } from '../../calc/units.ts';
import type { UnitsSystem } from '../../survey/model.ts';

/** What the formatters need to know about a survey. */
export interface FigureContext {
  locale: string;
  units: UnitsSystem;
  money: { currency: string };
}

/** Formatters bound to one survey. */
export interface UiFigures {
  /** Money in the survey's currency, whole units by default: "$1,235". */
  money(amount: number, digits?: number): string;
  /** A plain number: "1,234.5". */
  number(value: number, digits?: number): string;
  /** "12,345 kWh/yr". */
  kwhPerYear(value: number): string;
  /** "1.23 kW". */
  kw(value: number): string;
  /** "113 W". */
  watts(value: number, digits?: number): string;
  /** "1,130 VA". */
  voltAmperes(value: number): string;
  /** 0.0725 → "7.3 %". */
  percent(fraction: number, digits?: number): string;
  /** "3.4 years", "now" (rebates cover it) or "not repaid". */
  payback(years: number | null): string;
  /** One rate, several, or none. */
  irr(irr: IrrResult): string;
  /** "1.23 t CO2/yr" or "420 kg CO2/yr". */
  co2PerYear(kg: number): string;
  /** An SI quantity in the survey's units with its symbol: 538 lx → "50.0 fc". */
  quantity(quantity: DisplayQuantity, siValue: number): string;
  /** Unit symbol in the survey's units, e.g. "ft". */
  unit(quantity: DisplayQuantity): string;
}

/** Decimals per display quantity and units system. */
const quantityDigits: Readonly<Record<DisplayQuantity, Readonly<Record<UnitsSystem, number>>>> = {
  length: { si: 2, imperial: 1 },
  area: { si: 1, imperial: 0 },
  illuminance: { si: 0, imperial: 1 },
  powerDensity: { si: 2, imperial: 2 },
};

const dash = '—';

function finite(value: number | null | undefined): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

/**
 * The formatters for a survey.
 *
 * @example uiFigures({ locale: 'en-US', units: 'imperial', money: { currency: 'USD' } }).kwhPerYear(12345.4) //=> '12,345 kWh/yr'
 */
export function uiFigures(context: FigureContext): UiFigures {
  const { locale, units } = context;
  const currency = context.money.currency;
  const number = (value: number, digits = 0): string => (finite(value) ? formatNumber(value, locale, digits) : dash);
  const percent = (fraction: number, digits = 1): string => (finite(fraction) ? `${number(fraction * 100, digits)} %` : dash);
  return {
    money: (amount, digits = 0) => {
      if (!finite(amount)) return dash;
      try {
        return formatMoney(amount, currency, locale, digits);
      } catch {
        return `${number(amount, digits)} ${currency}`;
      }
    },
    number,
    kwhPerYear: (value) => `${number(value)} kWh/yr`,
    kw: (value) => `${number(value, 2)} kW`,
    watts: (value, digits = 0) => `${number(value, digits)} W`,
    voltAmperes: (value) => `${number(value)} VA`,
    percent,
    payback: (years) => (years === null ? 'not repaid' : years === 0 ? 'now (rebates cover it)' : `${number(years, 1)} years`),
    irr: (irr) => {
      switch (irr.kind) {
        case 'unique':
          return percent(irr.ratePerYear);
        case 'multiple':
          return `several (${irr.ratesPerYear.map((rate) => percent(rate)).join(', ')})`;
        case 'none':
          return 'none';
      }
    },
    co2PerYear: (kg) => (finite(kg) && Math.abs(kg) >= 1000 ? `${number(kg / 1000, 2)} t CO2/yr` : `${number(kg)} kg CO2/yr`),
    quantity: (quantity, siValue) =>
      `${finite(siValue) ? number(toDisplay(quantity, siValue, units), quantityDigits[quantity][units]) : dash} ${displayUnits[quantity][units]}`,
    unit: (quantity) => displayUnits[quantity][units],
  };
}

/**
 * A number as the text of an input field, in the locale's decimal sign, no
 * grouping, at most `digits` decimals (trailing zeros dropped).
 *
 * @example inputText(3.5, 'de-DE') //=> '3,5'
 */
export function inputText(value: number | undefined, locale: string, digits = 3): string {
  if (value === undefined || !Number.isFinite(value)) return '';
  try {
    return new Intl.NumberFormat(locale, { useGrouping: false, maximumFractionDigits: digits }).format(value);
  } catch {
    return String(Math.round(value * 10 ** digits) / 10 ** digits);
  }
}
