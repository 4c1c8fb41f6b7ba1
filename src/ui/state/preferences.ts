/**
 * The user's preferences on this device: look, the company shown on reports
 * and quotes, and the defaults a new survey starts from. Kept in
 * localStorage (the store's settings record has no place for them yet) and
 * checked field by field when read back: a missing or bad field falls back to
 * its default instead of reaching the screens.
 */
import { isKnownCurrency } from '../../calc/units.ts';
import type { BuildingType, GridFactorChoice, HeatingType, UnitsSystem } from '../../survey/model.ts';

/** Colour scheme: follow the device, light, dark, or high contrast for sunlight. */
export type Theme = 'auto' | 'light' | 'dark' | 'sun';

/** A logo for reports: a PNG or JPEG data URL with its pixel size. */
export interface Logo {
  dataUrl: string;
  width: number;
  height: number;
}

export interface Preferences {
  theme: Theme;
  companyName: string;
  /** Lines under the company name on documents (address, phone, licence). */
  companyDetails: string;
  logo: Logo | null;
  preparedBy: string;
  units: UnitsSystem;
  currency: string;
  locale: string;
  energyRatePerKwh: number;
  demandChargePerKwMonth: number;
  labourRatePerHour: number;
  taxFraction: number;
  markupFraction: number;
  buildingType: BuildingType;
  heatingType: HeatingType;
  /** The grid factor for new surveys; null: the published factor for the device's region. */
  grid: GridFactorChoice | null;
  circuitVolts: number;
  quoteValidDays: number;
  sparePercent: number;
  /** Decimal sign in CSV files written and read. */
  csvDecimal: '.' | ',';
}

const storageKey = 'lampwalk.preferences';

/**
 * The region of a locale ("GB" for "en-GB"), or '' when it names none.
 *
 * @example region('en-GB') //=> 'GB'
 */
export function region(locale: string): string {
  try {
    return new Intl.Locale(locale).maximize().region ?? '';
  } catch {
    return '';
  }
}

/** Regions that wire lighting at 120 V and measure in feet (US and its neighbours on the same practice). */
const feetRegions = new Set(['US', 'LR', 'MM']);
const volts120Regions = new Set(['US', 'CA', 'MX', 'PR']);

/**
 * Defaults for a device whose language is `locale`. The money figures start
 * at zero: prices are the client's and the contractor's own, so Lampwalk asks
 * for them rather than guessing.
 *
 * @example defaultPreferences('en-US').units //=> 'imperial'
 */
export function defaultPreferences(locale: string): Preferences {
  const where = region(locale);
  const currencyByRegion: Record<string, string> = { US: 'USD', GB: 'GBP', CA: 'CAD', AU: 'AUD', NZ: 'NZD', IE: 'EUR', IN: 'INR', CH: 'CHF', JP: 'JPY' };
  const euro = ['DE', 'FR', 'ES', 'IT', 'NL', 'BE', 'AT', 'PT', 'FI', 'GR', 'LU', 'SK', 'SI', 'EE', 'LV', 'LT', 'MT', 'CY', 'HR'];
  const currency = currencyByRegion[where] ?? (euro.includes(where) ? 'EUR' : 'USD');
  return {
    theme: 'auto',
    companyName: '',
    companyDetails: '',
    logo: null,
    preparedBy: '',
    units: feetRegions.has(where) ? 'imperial' : 'si',
    currency,
    locale,
    energyRatePerKwh: 0,
    demandChargePerKwMonth: 0,
    labourRatePerHour: 0,
    taxFraction: 0,
    markupFraction: 0,
    buildingType: 'office-small',
    heatingType: 'fossil',
    grid: null,
    circuitVolts: volts120Regions.has(where) ? 120 : 230,
    quoteValidDays: 30,
    sparePercent: 5,
    csvDecimal: new Intl.NumberFormat(locale).format(1.5).includes(',') ? ',' : '.',
  };
}

function isLocale(tag: unknown): tag is string {
  if (typeof tag !== 'string' || tag === '') return false;
  try {
    Intl.getCanonicalLocales(tag);
    return true;
  } catch {
    return false;
  }
}

function numberIn(value: unknown, min: number, max: number): value is number {
  return typeof value === 'number' && Number.isFinite(value) && value >= min && value <= max;
}

function text(value: unknown, max = 2000): value is string {
  return typeof value === 'string' && value.length <= max;
}

function isGrid(value: unknown): value is GridFactorChoice {
  if (typeof value !== 'object' || value === null || !('kind' in value)) return false;
  const grid = value as Record<string, unknown>;
  // The calculation checks the subregion and year against its tables when a survey uses them.
  if (grid.kind === 'egrid') return typeof grid.subregion === 'string' && /^[A-Z]{2,5}$/.test(grid.subregion);
  if (grid.kind === 'uk') return typeof grid.year === 'number' && Number.isInteger(grid.year) && grid.year >= 2000 && grid.year <= 2100;
  if (grid.kind === 'custom') return numberIn(grid.kgCo2PerKwh, 0, 2.5) && text(grid.label, 200);
  return false;
}

function isLogo(value: unknown): value is Logo {
  if (typeof value !== 'object' || value === null) return false;
  const logo = value as Record<string, unknown>;
  return (
    typeof logo.dataUrl === 'string' &&
    /^data:image\/(png|jpeg);base64,[A-Za-z0-9+/=]+$/.test(logo.dataUrl) &&
    numberIn(logo.width, 1, 4000) &&
    numberIn(logo.height, 1, 4000)
  );
}

/** The closed sets, as lookups (the compiler checks they hold every member). */
const buildingTypes = {
  'office-large': true,
  'office-small': true,
  school: true,
  retail: true,
  warehouse: true,
  restaurant: true,
  hospital: true,
  exterior: true,
  multifamily: true,
  other: true,
} satisfies Record<BuildingType, true>;
const heatingTypes = { 'electric-resistance': true, 'heat-pump': true, fossil: true, refrigerated: true, unconditioned: true } satisfies Record<HeatingType, true>;

const checks: { [K in keyof Preferences]: (value: unknown) => boolean } = {
  theme: (value) => value === 'auto' || value === 'light' || value === 'dark' || value === 'sun',
  companyName: (value) => text(value, 200),
  companyDetails: (value) => text(value, 1000),
  logo: (value) => value === null || isLogo(value),
  preparedBy: (value) => text(value, 200),
  units: (value) => value === 'si' || value === 'imperial',
  currency: (value) => typeof value === 'string' && isKnownCurrency(value),
  locale: isLocale,
  energyRatePerKwh: (value) => numberIn(value, 0, 100),
  demandChargePerKwMonth: (value) => numberIn(value, 0, 10_000),
  labourRatePerHour: (value) => numberIn(value, 0, 10_000),
  taxFraction: (value) => numberIn(value, 0, 1),
  markupFraction: (value) => numberIn(value, 0, 5),
  buildingType: (value) => typeof value === 'string' && Object.hasOwn(buildingTypes, value),
  heatingType: (value) => typeof value === 'string' && Object.hasOwn(heatingTypes, value),
  grid: (value) => value === null || isGrid(value),
  circuitVolts: (value) => numberIn(value, 12, 1000),
  quoteValidDays: (value) => numberIn(value, 1, 365) && Number.isInteger(value),
  sparePercent: (value) => numberIn(value, 0, 100),
  csvDecimal: (value) => value === '.' || value === ',',
};

/**
 * Preferences from stored text: every field that passes its check is kept,
 * the rest come from `defaults`.
 *
 * @example readPreferences('{"theme":"sun","currency":"EUR"}', defaultPreferences('de-DE')).theme //=> 'sun'
 */
export function readPreferences(textValue: string | null, defaults: Preferences): Preferences {
  if (!textValue) return defaults;
  let parsed: unknown;
  try {
    parsed = JSON.parse(textValue);
  } catch {
    return defaults;
  }
  if (typeof parsed !== 'object' || parsed === null) return defaults;
  const stored = parsed as Record<string, unknown>;
  const result: Record<string, unknown> = { ...defaults };
  for (const key of Object.keys(checks) as (keyof Preferences)[]) {
    if (Object.hasOwn(stored, key) && checks[key](stored[key])) result[key] = stored[key];
  }
  return result as unknown as Preferences;
}

/**
 * Problems with a preferences value before it is kept (an empty list when fine).
 *
 * @example preferenceProblems({ ...prefs, circuitVolts: 5 }) //=> ['circuitVolts']
 */
export function preferenceProblems(preferences: Preferences): (keyof Preferences)[] {
  return (Object.keys(checks) as (keyof Preferences)[]).filter((key) => !checks[key](preferences[key]));
}

function deviceLocale(): string {
  const language = typeof navigator === 'undefined' ? 'en-US' : navigator.language;
  return isLocale(language) ? language : 'en-US';
}

/**
 * The preferences saved on this device (or the defaults for its language).
 *
 * @example loadPreferences().theme //=> 'auto' on a new device
 */
export function loadPreferences(): Preferences {
  const defaults = defaultPreferences(deviceLocale());
  try {
    return readPreferences(localStorage.getItem(storageKey), defaults);
  } catch {
    return defaults;
  }
}

/**
 * Keeps the preferences on this device; returns a message when the browser refuses.
 *
 * @example savePreferences({ ...prefs, theme: 'sun' }) //=> null (kept)
 */
export function savePreferences(preferences: Preferences): string | null {
  const bad = preferenceProblems(preferences);
  if (bad.length > 0) return `Not saved: ${bad.join(', ')} is not valid.`;
  try {
    localStorage.setItem(storageKey, JSON.stringify(preferences));
    return null;
  } catch {
    return 'This browser refused to keep the settings (storage full or turned off). They apply until the page is closed.';
  }
}
