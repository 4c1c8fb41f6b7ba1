/**
 * Grid emission factors and the CO2 avoided by saving electricity.
 *
 * Two published families are built in, plus a factor typed by the user:
 * - US EPA eGRID2022 subregion CO2 total output emission rates (lb/MWh), as
 *   listed in the EPA GHG Emission Factors Hub 2024, Table 6. These are CO2
 *   only, at the generator: no CH4/N2O and no transmission and distribution
 *   losses.
 * - UK Government GHG conversion factors for company reporting, UK
 *   electricity generation (kg CO2e/kWh). These are CO2 equivalent (CO2, CH4,
 *   N2O); transmission and distribution losses are a separate factor and are
 *   not included.
 *
 * Avoided emissions are an average-grid (location-based) estimate: savings in
 * kWh times the average emission rate of the grid.
 */
import type { GridFactorChoice } from '../survey/model.ts';
import { CalcInputError, checkRange } from './errors.ts';
import { kilogramsPerPound } from './units.ts';

/**
 * Generous sanity limits: coal-fired generation emits roughly 1 kg CO2/kWh
 * (about 2,200 lb/MWh), so anything above these is a typing error.
 */
const maxKgCo2PerKwh = 2.5;
const maxLbCo2PerMwh = 5000;

/**
 * eGRID2022 CO2 total output emission rates by subregion acronym, lb/MWh,
 * with 'US' for the national average. Source: US EPA eGRID2022 via the EPA
 * GHG Emission Factors Hub 2024, Table 6.
 *
 * Provenance of each figure: rows marked "notes" were confirmed in the
 * project's reference notes; the other rows were read from a secondary
 * transcription of the same table (which agrees with every confirmed row)
 * and should be checked against Table 6 itself; the pairing of those rows'
 * acronyms with the subregion names is from memory.
 */
export const egridSubregions: Record<string, { label: string; lbCo2PerMwh: number }> = {
  AKGD: { label: 'ASCC Alaska Grid', lbCo2PerMwh: 1052.114 }, // secondary copy (two agree), verify
  AKMS: { label: 'ASCC Miscellaneous', lbCo2PerMwh: 495.772 }, // secondary copy, verify
  AZNM: { label: 'WECC Southwest', lbCo2PerMwh: 776.036 }, // secondary copy, verify
  CAMX: { label: 'WECC California', lbCo2PerMwh: 497.443 }, // notes
  ERCT: { label: 'ERCOT All', lbCo2PerMwh: 771.083 }, // notes
  FRCC: { label: 'FRCC All', lbCo2PerMwh: 813.846 }, // secondary copy, verify
  HIMS: { label: 'HICC Miscellaneous', lbCo2PerMwh: 1155.486 }, // secondary copy, verify
  HIOA: { label: 'HICC Oahu', lbCo2PerMwh: 1575.407 }, // secondary copy, verify
  MROE: { label: 'MRO East', lbCo2PerMwh: 1479.621 }, // notes
  MROW: { label: 'MRO West', lbCo2PerMwh: 936.485 }, // secondary copy, verify
  NEWE: { label: 'NPCC New England', lbCo2PerMwh: 536.428 }, // notes
  NWPP: { label: 'WECC Northwest', lbCo2PerMwh: 602.088 }, // secondary copy, verify
  NYCW: { label: 'NPCC NYC/Westchester', lbCo2PerMwh: 885.233 }, // secondary copy, verify
  NYLI: { label: 'NPCC Long Island', lbCo2PerMwh: 1200.708 }, // secondary copy, verify
  NYUP: { label: 'NPCC Upstate NY', lbCo2PerMwh: 274.559 }, // notes
  PRMS: { label: 'Puerto Rico Miscellaneous', lbCo2PerMwh: 1593.481 }, // secondary copy, verify
  RFCE: { label: 'RFC East', lbCo2PerMwh: 657.386 }, // notes
  RFCM: { label: 'RFC Michigan', lbCo2PerMwh: 1216.404 }, // secondary copy, verify
  RFCW: { label: 'RFC West', lbCo2PerMwh: 1000.053 }, // secondary copy, verify
  RMPA: { label: 'WECC Rockies', lbCo2PerMwh: 1124.887 }, // secondary copy, verify
  SPNO: { label: 'SPP North', lbCo2PerMwh: 952.575 }, // secondary copy, verify
  SPSO: { label: 'SPP South', lbCo2PerMwh: 970.398 }, // secondary copy, verify
  SRMV: { label: 'SERC Mississippi Valley', lbCo2PerMwh: 801.015 }, // secondary copy, verify
  SRMW: { label: 'SERC Midwest', lbCo2PerMwh: 1369.887 }, // notes
  SRSO: { label: 'SERC South', lbCo2PerMwh: 893.29 }, // secondary copy, verify
  SRTV: { label: 'SERC Tennessee Valley', lbCo2PerMwh: 933.067 }, // secondary copy, verify
  SRVC: { label: 'SERC Virginia/Carolina', lbCo2PerMwh: 622.987 }, // secondary copy, verify
  US: { label: 'US average', lbCo2PerMwh: 823.149 }, // notes
};

/**
 * UK Government GHG conversion factors for company reporting, UK electricity
 * generated, kg CO2e/kWh, by factor year. 2021–2024 were read from secondary
 * copies of the government workbooks (verify against the workbooks).
 */
export const ukGridFactors: Record<number, number> = {
  2018: 0.28307,
  2019: 0.2556,
  2020: 0.23314,
  2021: 0.21233, // secondary copy, verify
  2022: 0.19338, // secondary copy, verify
  2023: 0.20707, // secondary copy, verify
  2024: 0.20705, // secondary copy, verify
};

function subregionKey(subregion: string): string {
  if (typeof subregion !== 'string' || subregion.trim() === '') {
    throw new CalcInputError('grid.subregion', 'is empty; pick an eGRID subregion (e.g. "CAMX") or "US"');
  }
  const key = subregion.trim().toUpperCase();
  if (!Object.hasOwn(egridSubregions, key)) {
    throw new CalcInputError(
      'grid.subregion',
      `"${subregion}" is not an eGRID2022 subregion; use one of ${Object.keys(egridSubregions).join(', ')}`,
    );
  }
  return key;
}

function egridRow(subregion: string): { key: string; label: string; lbCo2PerMwh: number } {
  const key = subregionKey(subregion);
  const row = egridSubregions[key];
  if (!row) throw new CalcInputError('grid.subregion', `"${subregion}" is not an eGRID2022 subregion`);
  return { key, ...row };
}

function ukFactor(year: number): number {
  if (typeof year !== 'number' || !Number.isInteger(year)) {
    throw new CalcInputError('grid.year', `must be a whole year (got ${String(year)})`);
  }
  const factor = Object.hasOwn(ukGridFactors, year) ? ukGridFactors[year] : undefined;
  if (factor === undefined) {
    const years = Object.keys(ukGridFactors);
    throw new CalcInputError('grid.year', `no UK factor for ${year}; available years are ${years.join(', ')}`);
  }
  return factor;
}

function customFactor(kgCo2PerKwh: number): number {
  return checkRange('grid.kgCo2PerKwh', kgCo2PerKwh, 0, maxKgCo2PerKwh);
}

function unknownKind(choice: never): never {
  const kind = (choice as { kind?: unknown }).kind;
  throw new CalcInputError('grid.kind', `"${String(kind)}" is not a known grid factor kind (egrid, uk, custom)`);
}

/**
 * Converts an emission rate in pounds of CO2 per MWh to kg CO2 per kWh
 * (× 0.45359237 kg/lb, ÷ 1,000 kWh/MWh).
 *
 * @example poundsCo2PerMwhToKgPerKwh(1000) //=> 0.45359237
 */
export function poundsCo2PerMwhToKgPerKwh(lbPerMwh: number): number {
  checkRange('lbCo2PerMwh', lbPerMwh, 0, maxLbCo2PerMwh);
  return (lbPerMwh * kilogramsPerPound) / 1000;
}

/**
 * The grid factor for a survey's choice, kg CO2 (UK: CO2e) per kWh. Throws a
 * {@link CalcInputError} naming `grid.subregion`, `grid.year` or
 * `grid.kgCo2PerKwh` for an unknown subregion, a year without a factor, or a
 * custom factor outside 0–2.5.
 *
 * @example gridKgCo2PerKwh({ kind: 'uk', year: 2022 }) //=> 0.19338
 */
export function gridKgCo2PerKwh(choice: GridFactorChoice): number {
  switch (choice.kind) {
    case 'egrid':
      return poundsCo2PerMwhToKgPerKwh(egridRow(choice.subregion).lbCo2PerMwh);
    case 'uk':
      return ukFactor(choice.year);
    case 'custom':
      return customFactor(choice.kgCo2PerKwh);
    default:
      return unknownKind(choice);
  }
}

/**
 * A one-line, human-readable source for the chosen grid factor, for reports.
 *
 * @example gridFactorSource({ kind: 'uk', year: 2022 })
 * //=> 'UK Government GHG conversion factors for company reporting 2022, UK electricity generated: 0.19338 kg CO2e/kWh (transmission and distribution losses not included)'
 */
export function gridFactorSource(choice: GridFactorChoice): string {
  switch (choice.kind) {
    case 'egrid': {
      const row = egridRow(choice.subregion);
      const where = row.key === 'US' ? 'US average' : `subregion ${row.key} (${row.label})`;
      return (
        `US EPA eGRID2022, ${where}: ${row.lbCo2PerMwh} lb CO2/MWh total output emission rate ` +
        `(EPA GHG Emission Factors Hub 2024, Table 6)`
      );
    }
    case 'uk':
      return (
        `UK Government GHG conversion factors for company reporting ${choice.year}, UK electricity generated: ` +
        `${ukFactor(choice.year)} kg CO2e/kWh (transmission and distribution losses not included)`
      );
    case 'custom': {
      const factor = customFactor(choice.kgCo2PerKwh);
      const label = typeof choice.label === 'string' && choice.label.trim() !== '' ? choice.label.trim() : 'Custom grid factor';
      return `${label}: ${factor} kg CO2/kWh (entered by the user)`;
    }
    default:
      return unknownKind(choice);
  }
}

/**
 * CO2 avoided per year, kg: kWh saved × grid factor. Negative savings (a
 * change that uses more energy) give a negative result, i.e. added emissions.
 *
 * @example co2AvoidedKgPerYear(10000, 0.2) //=> 2000
 */
export function co2AvoidedKgPerYear(kwhSavedPerYear: number, kgCo2PerKwh: number): number {
  checkRange('kwhSavedPerYear', kwhSavedPerYear, -1e12, 1e12);
  checkRange('kgCo2PerKwh', kgCo2PerKwh, 0, maxKgCo2PerKwh);
  return kwhSavedPerYear * kgCo2PerKwh;
}
