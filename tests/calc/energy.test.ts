import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  annualHours,
  buildingOperatingDefaults,
  controlSavingsFraction,
  energySavings,
  hvacInteractiveDefaults,
  kwhPerYear,
} from '../../src/calc/energy.ts';
import type { BuildingType, HeatingType } from '../../src/survey/model.ts';

describe('hours of use', () => {
  it('takes annual hours as given, within 0–8,760', () => {
    expect(annualHours({ kind: 'annual', hoursPerYear: 8760 })).toBe(8760);
    expect(() => annualHours({ kind: 'annual', hoursPerYear: 8761 })).toThrow(/hours\.hoursPerYear: must be between 0 and 8760/);
    expect(() => annualHours({ kind: 'annual', hoursPerYear: Number.NaN })).toThrow(/hours\.hoursPerYear/);
  });

  it('turns a weekly schedule into annual hours over 365/7 weeks', () => {
    // 365 days / 7 = 52.143 weeks in a common year; 50 h a week → 2,607.1 h
    expect(annualHours({ kind: 'weekly', days: [10, 10, 10, 10, 10, 0, 0] })).toBeCloseTo((50 * 365) / 7, 9);
    // every hour of every day is the whole year
    expect(annualHours({ kind: 'weekly', days: [24, 24, 24, 24, 24, 24, 24] })).toBe(8760);
    expect(annualHours({ kind: 'weekly', days: [8, 8, 8, 8, 8, 0, 0], weeksPerYear: 50 })).toBe(2000);
    expect(() => annualHours({ kind: 'weekly', days: [8, 8, 8, 25, 8, 0, 0] })).toThrow(/hours\.days\[3\]/);
  });
});

describe('control savings fractions', () => {
  it('uses the space type fraction for occupancy and vacancy sensors', () => {
    // ASHRAE/IES 90.1-2019 Appendix G Table G3.7: restroom 0.45
    expect(controlSavingsFraction('occupancy-sensor', 0.45)).toBe(0.45);
    expect(controlSavingsFraction('vacancy-sensor', 0.45)).toBe(0.45);
    expect(controlSavingsFraction('none', 0.45)).toBe(0);
  });

  it('lets the entry override the default, within 0–0.9', () => {
    expect(controlSavingsFraction('timer', 0, 0.2)).toBe(0.2);
    expect(() => controlSavingsFraction('timer', 0, 0.95)).toThrow(/controlSavingsFraction/);
  });
});

describe('HVAC interactive factors (BPA "HVAC Interactive Effects", 2012)', () => {
  const table: [BuildingType, HeatingType, number, number][] = [
    // building, heating, energy factor, gas therms per kWh — BPA 2012 table as transcribed in REFERENCES
    ['office-large', 'electric-resistance', 0.92, 0],
    ['office-large', 'heat-pump', 1.02, 0],
    ['office-large', 'fossil', 1.08, -0.00819],
    ['office-small', 'fossil', 1.12, -0.02138],
    ['school', 'electric-resistance', 0.57, 0],
    ['school', 'fossil', 1.0, -0.02184],
    ['retail', 'heat-pump', 0.93, 0],
    ['warehouse', 'fossil', 0.96, -0.01774],
    ['restaurant', 'electric-resistance', 0.43, 0],
    ['hospital', 'fossil', 0.94, -0.03276],
    ['hospital', 'refrigerated', 1.3, 0],
    ['exterior', 'fossil', 1.0, 0],
  ];
  it.each(table)('%s with %s heating', (building, heating, factor, gas) => {
    const d = hvacInteractiveDefaults(building, heating);
    expect(d.energyFactor).toBe(factor);
    expect(d.gasThermsPerKwh).toBe(gas);
    expect(d.source).toMatch(/Bonneville/);
  });

  it('gives 1.0 and says so where the table has no row', () => {
    const d = hvacInteractiveDefaults('multifamily', 'fossil');
    expect(d.energyFactor).toBe(1);
    expect(d.source).toMatch(/no row/);
    expect(hvacInteractiveDefaults('office-large', 'unconditioned').energyFactor).toBe(1);
  });

  it('has operating defaults for every building type, within physical limits', () => {
    for (const d of Object.values(buildingOperatingDefaults)) {
      expect(d.hoursPerYear).toBeGreaterThan(0);
      expect(d.hoursPerYear).toBeLessThanOrEqual(8760);
      expect(d.coincidenceFactor).toBeGreaterThanOrEqual(0);
      expect(d.coincidenceFactor).toBeLessThanOrEqual(1);
    }
  });
});

describe('savings by the DOE Uniform Methods Project lighting protocol', () => {
  it('computes ΔkWh, connected ΔkW and peak ΔkW (UMP Ch. 2, NREL/SR-7A40-68558)', () => {
    // Hand-worked with the UMP formulas: 10 fixtures 113 W → 50 W, 3,000 h; HVAC_c from BPA small office, gas (1.12);
    // CF 0.7, HVAC_d 1.0.
    const existing = { watts: 1130, kwhPerYear: kwhPerYear(10, 113, 3000) };
    const proposed = { watts: 500, kwhPerYear: kwhPerYear(10, 50, 3000) };
    expect(existing.kwhPerYear).toBe(3390);
    const s = energySavings(existing, proposed, {
      hvacEnergyFactor: 1.12,
      hvacDemandFactor: 1,
      coincidenceFactor: 0.7,
      gasThermsPerKwhSaved: -0.02138,
    });
    // ΔkWh = (1.130 − 0.500) kW × 3,000 h × 1.12 = 2,116.8 kWh
    expect(s.lightingKwhPerYear).toBeCloseTo(1890, 9);
    expect(s.kwhPerYear).toBeCloseTo(2116.8, 9);
    // ΔkW = 0.63 kW; peak = 0.63 × 0.7 × 1.0
    expect(s.connectedKw).toBeCloseTo(0.63, 12);
    expect(s.peakKw).toBeCloseTo(0.441, 12);
    // BPA gas penalty: 1,890 kWh × −0.02138 therm/kWh = −40.41 therms
    expect(s.gasThermsPerYear).toBeCloseTo(-40.4082, 4);
  });

  it('reduces post hours by the control fraction (UMP: HOU_post differs from HOU_base)', () => {
    const base = { watts: 100, kwhPerYear: kwhPerYear(1, 100, 4000) };
    const post = { watts: 100, kwhPerYear: kwhPerYear(1, 100, 4000 * (1 - 0.3)) };
    const s = energySavings(base, post, { hvacEnergyFactor: 1, hvacDemandFactor: 1, coincidenceFactor: 1, gasThermsPerKwhSaved: 0 });
    expect(s.kwhPerYear).toBeCloseTo(120, 9);
    expect(s.connectedKw).toBe(0);
  });

  it('savings equal existing minus proposed for any inputs (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e6, noNaN: true }),
        fc.double({ min: 0, max: 1e6, noNaN: true }),
        fc.double({ min: 0, max: 8760, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        (wBase, wPost, hours, factor) => {
          const e = { watts: wBase, kwhPerYear: kwhPerYear(1, wBase, hours) };
          const p = { watts: wPost, kwhPerYear: kwhPerYear(1, wPost, hours) };
          const s = energySavings(e, p, { hvacEnergyFactor: factor, hvacDemandFactor: 1, coincidenceFactor: 1, gasThermsPerKwhSaved: 0 });
          expect(s.lightingKwhPerYear).toBeCloseTo(e.kwhPerYear - p.kwhPerYear, 6);
          expect(s.kwhPerYear).toBeCloseTo((e.kwhPerYear - p.kwhPerYear) * factor, 4);
          expect(Number.isFinite(s.kwhPerYear) && Number.isFinite(s.peakKw)).toBe(true);
        },
      ),
    );
  });
});
