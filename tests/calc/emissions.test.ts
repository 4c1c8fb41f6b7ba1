import { createRequire } from 'node:module';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../src/calc/errors.ts';
import {
  co2AvoidedKgPerYear,
  egridSubregions,
  gridFactorSource,
  gridKgCo2PerKwh,
  poundsCo2PerMwhToKgPerKwh,
  ukGridFactors,
} from '../../src/calc/emissions.ts';
import type { GridFactorChoice } from '../../src/survey/model.ts';

// convert-units 2.3.4 ships no type declarations; load it through require and
// describe the small part of its API used here.
type ConvertUnits = (value: number) => { from(unit: string): { to(unit: string): number } };
const convert: ConvertUnits = createRequire(import.meta.url)('convert-units');

/**
 * convert-units defines the pound as 453.592 g (rounded), against the exact
 * 453.59237 g, so the two agree to about 8 parts in 10 million.
 */
const convertUnitsRelativeTolerance = 1e-6;

function expectRelativelyClose(actual: number, expected: number, relative: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative);
}

/** Runs `action` and returns the CalcInputError it throws (fails the test otherwise). */
function inputError(action: () => unknown): CalcInputError {
  try {
    action();
  } catch (error) {
    expect(error).toBeInstanceOf(CalcInputError);
    return error as CalcInputError;
  }
  throw new Error('expected a CalcInputError, but nothing was thrown');
}

describe('pounds per MWh to kilograms per kWh', () => {
  it('uses the exact avoirdupois pound', () => {
    // International yard and pound agreement (1959): 1 lb = 0.45359237 kg exactly; 1 MWh = 1,000 kWh
    expect(poundsCo2PerMwhToKgPerKwh(1000)).toBe(0.45359237);
    expect(poundsCo2PerMwhToKgPerKwh(0)).toBe(0);
  });

  it('agrees with the convert-units package', () => {
    // convert-units mass measure (lb → kg), pound rounded to 453.592 g
    for (const lbPerMwh of [823.149, 497.443, 274.559, 1479.621, 1]) {
      const viaPackage = convert(lbPerMwh).from('lb').to('kg') / 1000;
      expectRelativelyClose(poundsCo2PerMwhToKgPerKwh(lbPerMwh), viaPackage, convertUnitsRelativeTolerance);
    }
  });

  it('rejects bad input with the field named', () => {
    expect(inputError(() => poundsCo2PerMwhToKgPerKwh(-1)).field).toBe('lbCo2PerMwh');
    expect(inputError(() => poundsCo2PerMwhToKgPerKwh(Number.NaN)).field).toBe('lbCo2PerMwh');
  });
});

describe('eGRID2022 subregion rates', () => {
  it('match the published CO2 total output emission rates', () => {
    // US EPA eGRID2022 via EPA GHG Emission Factors Hub 2024, Table 6 (lb CO2/MWh)
    expect(egridSubregions['US']?.lbCo2PerMwh).toBe(823.149);
    expect(egridSubregions['CAMX']?.lbCo2PerMwh).toBe(497.443);
    expect(egridSubregions['ERCT']?.lbCo2PerMwh).toBe(771.083);
    expect(egridSubregions['NEWE']?.lbCo2PerMwh).toBe(536.428);
    expect(egridSubregions['NYUP']?.lbCo2PerMwh).toBe(274.559);
    expect(egridSubregions['RFCE']?.lbCo2PerMwh).toBe(657.386);
    expect(egridSubregions['MROE']?.lbCo2PerMwh).toBe(1479.621);
    expect(egridSubregions['SRMW']?.lbCo2PerMwh).toBe(1369.887);
    // Same table, read from two independent secondary copies (verify against Table 6)
    expect(egridSubregions['AKGD']?.lbCo2PerMwh).toBe(1052.114);
  });

  it('list all 27 eGRID2022 subregions plus the US average', () => {
    // EPA GHG Emission Factors Hub 2024, Table 6 (as transcribed): 27 subregion rows, Puerto Rico (PRMS) included, plus the US
    expect(Object.keys(egridSubregions)).toHaveLength(28);
    expect(Object.keys(egridSubregions)).toContain('PRMS');
    expect(Object.keys(egridSubregions)).toContain('US');
  });

  it('put the US average between the cleanest and dirtiest subregion', () => {
    // A generation-weighted mean lies between the smallest and largest of its parts (mathematics)
    const rates = Object.entries(egridSubregions)
      .filter(([key]) => key !== 'US')
      .map(([, row]) => row.lbCo2PerMwh);
    const us = egridSubregions['US']?.lbCo2PerMwh ?? Number.NaN;
    expect(us).toBeGreaterThan(Math.min(...rates));
    expect(us).toBeLessThan(Math.max(...rates));
    for (const rate of rates) {
      expect(rate).toBeGreaterThan(0);
      expect(rate).toBeLessThan(2500);
    }
  });
});

describe('gridKgCo2PerKwh', () => {
  it('converts an eGRID subregion to kg/kWh', () => {
    // EPA eGRID2022 (GHG Emission Factors Hub 2024, Table 6): US 823.149 lb/MWh; lb → kg by convert-units
    const us = gridKgCo2PerKwh({ kind: 'egrid', subregion: 'US' });
    expectRelativelyClose(us, convert(823.149).from('lb').to('kg') / 1000, convertUnitsRelativeTolerance);
    // 823.149 × 0.45359237 / 1000 = 0.373374… (exact pound, 1959 agreement)
    expect(us).toBeCloseTo(0.373374, 6);
    // Subregion codes are matched without regard to case or surrounding spaces
    expect(gridKgCo2PerKwh({ kind: 'egrid', subregion: ' camx ' })).toBeCloseTo(0.225636, 6);
  });

  it('returns the UK factor for the year', () => {
    // UK Government GHG conversion factors for company reporting, UK electricity generated (kg CO2e/kWh)
    expect(gridKgCo2PerKwh({ kind: 'uk', year: 2018 })).toBe(0.28307);
    expect(gridKgCo2PerKwh({ kind: 'uk', year: 2019 })).toBe(0.2556);
    expect(gridKgCo2PerKwh({ kind: 'uk', year: 2020 })).toBe(0.23314);
    // 2021–2024 from secondary copies of the same government factors (verify)
    expect(gridKgCo2PerKwh({ kind: 'uk', year: 2022 })).toBe(0.19338);
    expect(gridKgCo2PerKwh({ kind: 'uk', year: 2024 })).toBe(0.20705);
    expect(Object.keys(ukGridFactors)).toEqual(['2018', '2019', '2020', '2021', '2022', '2023', '2024']);
  });

  it('passes a custom factor through', () => {
    // Common practice, no published source: a user-entered factor is used as given
    expect(gridKgCo2PerKwh({ kind: 'custom', kgCo2PerKwh: 0.4, label: 'Utility disclosure 2023' })).toBe(0.4);
    expect(gridKgCo2PerKwh({ kind: 'custom', kgCo2PerKwh: 0, label: 'Green tariff' })).toBe(0);
  });

  it('rejects unknown or invalid choices with the field named', () => {
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'egrid', subregion: 'XXXX' })).field).toBe('grid.subregion');
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'egrid', subregion: '' })).field).toBe('grid.subregion');
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'egrid', subregion: 'constructor' })).field).toBe('grid.subregion');
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'uk', year: 2017 })).field).toBe('grid.year');
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'uk', year: 2022.5 })).field).toBe('grid.year');
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'custom', kgCo2PerKwh: -0.1, label: 'x' })).field).toBe('grid.kgCo2PerKwh');
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'custom', kgCo2PerKwh: Number.NaN, label: 'x' })).field).toBe('grid.kgCo2PerKwh');
    expect(inputError(() => gridKgCo2PerKwh({ kind: 'custom', kgCo2PerKwh: 5, label: 'x' })).field).toBe('grid.kgCo2PerKwh');
    // Data read back from storage might carry a kind this version does not know
    const stored: unknown = JSON.parse('{"kind":"nordic","factor":0.1}');
    expect(inputError(() => gridKgCo2PerKwh(stored as GridFactorChoice)).field).toBe('grid.kind');
  });
});

describe('gridFactorSource', () => {
  it('names the dataset, the region and the figure', () => {
    // EPA eGRID2022 via GHG Emission Factors Hub 2024, Table 6
    const egrid = gridFactorSource({ kind: 'egrid', subregion: 'camx' });
    expect(egrid).toContain('eGRID2022');
    expect(egrid).toContain('CAMX (WECC California)');
    expect(egrid).toContain('497.443 lb CO2/MWh');
    expect(egrid).toContain('Table 6');
    expect(gridFactorSource({ kind: 'egrid', subregion: 'US' })).toContain('US average');
    // UK Government GHG conversion factors for company reporting
    expect(gridFactorSource({ kind: 'uk', year: 2022 })).toBe(
      'UK Government GHG conversion factors for company reporting 2022, UK electricity generated: 0.19338 kg CO2e/kWh (transmission and distribution losses not included)',
    );
    expect(gridFactorSource({ kind: 'custom', kgCo2PerKwh: 0.4, label: 'Utility disclosure 2023' })).toBe(
      'Utility disclosure 2023: 0.4 kg CO2/kWh (entered by the user)',
    );
    expect(gridFactorSource({ kind: 'custom', kgCo2PerKwh: 0.4, label: ' ' })).toContain('Custom grid factor');
  });

  it('rejects the same bad choices as the factor itself', () => {
    expect(inputError(() => gridFactorSource({ kind: 'egrid', subregion: 'NOPE' })).field).toBe('grid.subregion');
    expect(inputError(() => gridFactorSource({ kind: 'uk', year: 1990 })).field).toBe('grid.year');
    expect(inputError(() => gridFactorSource({ kind: 'custom', kgCo2PerKwh: -1, label: 'x' })).field).toBe('grid.kgCo2PerKwh');
  });
});

describe('co2AvoidedKgPerYear', () => {
  it('multiplies kWh saved by the grid factor', () => {
    // Average-grid (location-based) avoided emissions = energy saved × emission factor (common practice)
    expect(co2AvoidedKgPerYear(10000, 0.2)).toBe(2000);
    // UK GHG conversion factors 2022: 0.19338 kg CO2e/kWh × 5,000 kWh = 966.9 kg
    expect(co2AvoidedKgPerYear(5000, gridKgCo2PerKwh({ kind: 'uk', year: 2022 }))).toBeCloseTo(966.9, 9);
  });

  it('1 MWh saved in CAMX avoids 497.443 lb of CO2', () => {
    // EPA eGRID2022 (GHG Emission Factors Hub 2024, Table 6): CAMX 497.443 lb/MWh; lb → kg by convert-units
    const kg = co2AvoidedKgPerYear(1000, gridKgCo2PerKwh({ kind: 'egrid', subregion: 'CAMX' }));
    expectRelativelyClose(kg, convert(497.443).from('lb').to('kg'), convertUnitsRelativeTolerance);
  });

  it('gives a negative result for negative savings', () => {
    // Added consumption adds emissions (sign convention of this module)
    expect(co2AvoidedKgPerYear(-100, 0.5)).toBe(-50);
  });

  it('rejects bad input with the field named', () => {
    expect(inputError(() => co2AvoidedKgPerYear(Number.NaN, 0.2)).field).toBe('kwhSavedPerYear');
    expect(inputError(() => co2AvoidedKgPerYear(Number.POSITIVE_INFINITY, 0.2)).field).toBe('kwhSavedPerYear');
    expect(inputError(() => co2AvoidedKgPerYear(100, -0.2)).field).toBe('kgCo2PerKwh');
  });

  it('is linear in kWh and never NaN for valid input', () => {
    // Avoided emissions = kWh × factor is linear in kWh (common practice, no published source)
    const kwh = fc.double({ min: -1e7, max: 1e7, noNaN: true });
    const factor = fc.double({ min: 0, max: 2.5, noNaN: true });
    fc.assert(
      fc.property(kwh, kwh, factor, (a, b, f) => {
        const sum = co2AvoidedKgPerYear(a + b, f);
        expect(Number.isNaN(sum)).toBe(false);
        expect(sum).toBeCloseTo(co2AvoidedKgPerYear(a, f) + co2AvoidedKgPerYear(b, f), 3);
      }),
    );
  });

  it('every built-in factor converts to a finite kg/kWh in a plausible range', () => {
    // Grid factors worldwide lie roughly 0–1.2 kg CO2/kWh (from memory)
    const choices: GridFactorChoice[] = [
      ...Object.keys(egridSubregions).map((subregion): GridFactorChoice => ({ kind: 'egrid', subregion })),
      ...Object.keys(ukGridFactors).map((year): GridFactorChoice => ({ kind: 'uk', year: Number(year) })),
    ];
    for (const choice of choices) {
      const factor = gridKgCo2PerKwh(choice);
      expect(Number.isFinite(factor)).toBe(true);
      expect(factor).toBeGreaterThan(0);
      expect(factor).toBeLessThan(1.2);
      expect(gridFactorSource(choice).length).toBeGreaterThan(20);
    }
  });
});
