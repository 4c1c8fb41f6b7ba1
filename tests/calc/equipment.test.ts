/**
 * Existing equipment: which wattage figure wins, the published table rows
 * checked against their sources, the ballast multipliers derived from those
 * rows, input checking, mercury and the PCB cut-off year.
 */
import { describe, expect, it } from 'vitest';
import type { BallastKind, ExistingEquipment, ExistingTechnology } from '../../src/survey/model.ts';
import { CalcInputError } from '../../src/calc/errors.ts';
import {
  estimatedBallastMultiplier,
  existingFixtureWatts,
  findTypicalEquipment,
  hasMercury,
  lastPcbBallastYear,
  mercuryTechnologies,
  typicalExistingEquipment,
  type TypicalEquipment,
} from '../../src/calc/equipment.ts';

type WattsInput = Parameters<typeof existingFixtureWatts>[0];

function fixture(
  technology: ExistingTechnology,
  ballast: BallastKind,
  lampsPerFixture: number,
  ratedWattsPerLamp: number,
  extra: Partial<Pick<ExistingEquipment, 'fixtureInputWatts' | 'meteredWattsPerFixture'>> = {},
): WattsInput {
  return { technology, ballast, lampsPerFixture, ratedWattsPerLamp, ...extra };
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

function row(key: string): TypicalEquipment {
  const found = typicalExistingEquipment.find((r) => r.key === key);
  if (!found) throw new Error(`no table row "${key}"`);
  return found;
}

const csuSource = /Colorado State University Extension.*Business Lighting 101.*2017/;

describe('existingFixtureWatts precedence: metered > fixture input > table row > estimate', () => {
  // 4-lamp F32T8 on an electronic ballast: 113 W (Colorado State University Extension, "Business Lighting 101", 2017)
  const t8 = (extra: Parameters<typeof fixture>[4] = {}) => fixture('linear-t8', 'electronic', 4, 32, extra);

  it('a metered reading wins over fixture input watts and the table; the rated figure is kept beside it', () => {
    expect(existingFixtureWatts(t8({ meteredWattsPerFixture: 118, fixtureInputWatts: 120 }))).toEqual({
      wattsPerFixture: 118,
      basis: 'metered',
      ratedLampWatts: 128, // 4 × 32 W
      ratedFixtureWatts: 120,
    });
    // With no input watts given, the rated figure beside the meter reading is the table row
    expect(existingFixtureWatts(t8({ meteredWattsPerFixture: 118 })).ratedFixtureWatts).toBe(113); // CSU Extension 2017
  });

  it('fixture input watts win over the table row', () => {
    expect(existingFixtureWatts(t8({ fixtureInputWatts: 108 }))).toEqual({
      wattsPerFixture: 108,
      basis: 'fixture-input',
      ratedLampWatts: 128,
      ratedFixtureWatts: 108,
    });
  });

  it('the table row wins over the estimate', () => {
    expect(existingFixtureWatts(t8())).toEqual({ wattsPerFixture: 113, basis: 'table', ratedLampWatts: 128, ratedFixtureWatts: 113 }); // CSU Extension 2017
  });

  it('with no row the input is estimated from the lamp watts', () => {
    // 2-lamp F28T8 electronic has no row: 2 × 28 × 113 / 128 (multiplier from the CSU Extension 2017 F32T8 row)
    const w = existingFixtureWatts(fixture('linear-t8', 'electronic', 2, 28));
    expect(w.basis).toBe('estimated');
    expect(w.wattsPerFixture).toBeCloseTo((2 * 28 * 113) / 128, 12);
    expect(w.ratedLampWatts).toBe(56);
  });

  it('a metered reading of 0 W (a dead fixture) is used as given', () => {
    expect(existingFixtureWatts(t8({ meteredWattsPerFixture: 0 })).wattsPerFixture).toBe(0);
  });
});

describe('published table rows against their sources', () => {
  it.each([
    // Colorado State University Extension, "Business Lighting 101" (2017), 4-lamp 4 ft fixtures
    ['linear-t12', 'magnetic', 4, 40, 172],
    ['linear-t12', 'magnetic', 4, 34, 144],
    ['linear-t8', 'electronic', 4, 32, 113],
    ['linear-t8', 'electronic', 4, 28, 99],
  ] as const)('CSU Extension 2017: %s %s, %i × %i W → %i W', (technology, ballast, lamps, watts, input) => {
    const found = findTypicalEquipment(technology, ballast, lamps, watts);
    expect(found?.fixtureInputWatts).toBe(input); // Colorado State University Extension "Business Lighting 101" (2017)
    expect(found?.source).toMatch(csuSource);
    expect(existingFixtureWatts(fixture(technology, ballast, lamps, watts))).toMatchObject({ wattsPerFixture: input, basis: 'table' });
  });

  it.each([
    // Utility fixture wattage tables: metal halide lamp watts → fixture input watts
    [400, 458],
    [250, 295],
    [175, 215],
    [150, 190],
    [100, 128],
    [70, 95],
  ] as const)('utility wattage tables: metal halide %i W → %i W', (lampWatts, input) => {
    const found = findTypicalEquipment('metal-halide', 'magnetic', 1, lampWatts);
    expect(found?.fixtureInputWatts).toBe(input); // utility fixture wattage tables
    expect(found?.source).toMatch(/utility/);
    expect(existingFixtureWatts(fixture('metal-halide', 'magnetic', 1, lampWatts)).wattsPerFixture).toBe(input);
  });

  it('utility wattage tables: HPS 250 W → 295 W; CFL 26 W → 26 W, 42 W → 48 W', () => {
    expect(existingFixtureWatts(fixture('high-pressure-sodium', 'magnetic', 1, 250)).wattsPerFixture).toBe(295); // utility wattage tables
    expect(existingFixtureWatts(fixture('cfl-pin', 'electronic', 1, 26)).wattsPerFixture).toBe(26); // utility wattage tables
    expect(existingFixtureWatts(fixture('cfl-pin', 'electronic', 1, 42)).wattsPerFixture).toBe(48); // utility wattage tables
    for (const key of ['hps-250', 'cfl-pin-26', 'cfl-pin-42']) expect(row(key).source).toMatch(/utility/);
  });

  it('incandescent and halogen draw their rated watts (lamp label), in the table and off it', () => {
    for (const r of typicalExistingEquipment.filter((r) => r.technology === 'incandescent' || r.technology === 'halogen')) {
      expect(r.fixtureInputWatts).toBe(r.lampsPerFixture * r.ratedWattsPerLamp); // lamp label: input = rated watts
      expect(r.ballast).toBe('none');
    }
    expect(existingFixtureWatts(fixture('incandescent', 'none', 1, 60))).toMatchObject({ wattsPerFixture: 60, basis: 'table' });
    // A size with no row (2 × 53 W halogen) is taken at its rated watts, not "estimated"
    expect(existingFixtureWatts(fixture('halogen', 'none', 2, 53))).toEqual({
      wattsPerFixture: 106,
      basis: 'lamp-rated',
      ratedLampWatts: 106,
      ratedFixtureWatts: 106,
    });
  });

  it('the recalled T8 rows say "from memory" and agree with the REFERENCES figures (from memory)', () => {
    // REFERENCES "verify" rows (recalled, not confirmed): 1-lamp F32T8 ≈ 31 W, 2-lamp ≈ 59 W, 3-lamp ≈ 88 W — from memory
    expect(row('f32t8-1-elec').fixtureInputWatts).toBe(31); // from memory
    expect(row('f32t8-2-elec').fixtureInputWatts).toBe(59); // from memory
    expect(row('f32t8-3-elec').fixtureInputWatts).toBe(88); // from memory
    for (const key of ['f32t8-1-elec', 'f32t8-2-elec', 'f32t8-3-elec']) expect(row(key).source).toMatch(/from memory/);
  });

  it('every row names a source, and keys and lookups are unique', () => {
    const keys = new Set<string>();
    const lookups = new Set<string>();
    for (const r of typicalExistingEquipment) {
      expect(r.source.length).toBeGreaterThan(0);
      expect(r.fixtureInputWatts).toBeGreaterThan(0);
      keys.add(r.key);
      lookups.add(`${r.technology}|${r.ballast}|${r.lampsPerFixture}|${r.ratedWattsPerLamp}`);
      expect(findTypicalEquipment(r.technology, r.ballast, r.lampsPerFixture, r.ratedWattsPerLamp)).toBe(r);
    }
    expect(keys.size).toBe(typicalExistingEquipment.length);
    expect(lookups.size).toBe(typicalExistingEquipment.length);
  });

  it('no row for a combination that is not listed', () => {
    expect(findTypicalEquipment('linear-t12', 'magnetic', 2, 40)).toBeUndefined();
    expect(findTypicalEquipment('linear-t8', 'magnetic', 4, 32)).toBeUndefined(); // the ballast must match too
  });
});

describe('estimate multipliers derived from the published rows', () => {
  it('magnetic fluorescent: 172 W / (4 × 40 W) = 1.075 (CSU Extension 2017, F40T12 row)', () => {
    expect(estimatedBallastMultiplier('linear-t12', 'magnetic', 40)).toBeCloseTo(172 / 160, 12); // CSU Extension 2017
    expect(estimatedBallastMultiplier('linear-t12', 'magnetic', 40)).toBeCloseTo(1.075, 12);
  });

  it('electronic: 113 W / (4 × 32 W) = 0.883 (CSU Extension 2017, F32T8 row)', () => {
    expect(estimatedBallastMultiplier('linear-t8', 'electronic', 32)).toBeCloseTo(113 / 128, 12); // CSU Extension 2017
  });

  it('pin-base CFL: mean of 26 → 26 W and 42 → 48 W (utility wattage tables)', () => {
    expect(estimatedBallastMultiplier('cfl-pin', 'electronic', 32)).toBeCloseTo((1 + 48 / 42) / 2, 12);
  });

  it('HID: interpolated over the metal-halide rows, exact at each published size (utility wattage tables)', () => {
    const rows: [number, number][] = [[70, 95], [100, 128], [150, 190], [175, 215], [250, 295], [400, 458]];
    for (const t of ['metal-halide', 'high-pressure-sodium', 'mercury-vapour'] as const) {
      for (const [lamp, input] of rows) expect(estimatedBallastMultiplier(t, 'magnetic', lamp)).toBeCloseTo(input / lamp, 12);
    }
    // held flat beyond the table: 1,000 W at the 400 W ratio; 50 W at the 70 W ratio
    expect(estimatedBallastMultiplier('metal-halide', 'magnetic', 1000)).toBeCloseTo(458 / 400, 12);
    expect(estimatedBallastMultiplier('metal-halide', 'magnetic', 50)).toBeCloseTo(95 / 70, 12);
  });

  it('no ballast: 1 (lamp label)', () => {
    expect(estimatedBallastMultiplier('incandescent', 'none', 60)).toBe(1);
    expect(estimatedBallastMultiplier('led', 'none', 10)).toBe(1);
  });

  it('a ballasted lamp recorded without a ballast is estimated as magnetic, not taken at lamp watts', () => {
    expect(estimatedBallastMultiplier('linear-t12', 'none', 40)).toBeCloseTo(172 / 160, 12);
    const w = existingFixtureWatts(fixture('linear-t12', 'none', 2, 40));
    expect(w.basis).toBe('estimated');
    expect(w.wattsPerFixture).toBeCloseTo(86, 10);
  });

  it('2-lamp F40T12 magnetic, no row: 2 × 40 × 172 / 160 = 86 W', () => {
    const w = existingFixtureWatts(fixture('linear-t12', 'magnetic', 2, 40));
    expect(w.basis).toBe('estimated');
    expect(w.wattsPerFixture).toBeCloseTo(86, 10); // CSU Extension 2017 multiplier
    // REFERENCES (recalled, verify): 2-lamp F40T12 standard magnetic ≈ 86–94 W — from memory
    expect(w.wattsPerFixture).toBeGreaterThanOrEqual(86 - 1e-9);
    expect(w.wattsPerFixture).toBeLessThanOrEqual(94);
  });

  it('metal halide 320 W, no row: interpolated between the 250 W and 400 W rows', () => {
    const w = existingFixtureWatts(fixture('metal-halide', 'magnetic', 1, 320));
    expect(w).toMatchObject({ basis: 'estimated', ratedLampWatts: 320 });
    // utility wattage tables: 250 → 295 (1.18), 400 → 458 (1.145); 320 W is 70/150 of the way
    const ratio = 295 / 250 + ((458 / 400 - 295 / 250) * 70) / 150;
    expect(w.wattsPerFixture).toBeCloseTo(320 * ratio, 10);
  });

  it('the fluorescent multipliers reproduce the other CSU rows within 2 %', () => {
    // F34T12 magnetic: 4 × 34 × 1.075 = 146.2 W vs 144 W; F28T8 electronic: 4 × 28 × 0.883 = 98.9 W vs 99 W (CSU Extension 2017)
    for (const key of ['f34t12-4-mag', 'f28t8-4-elec']) {
      const r = row(key);
      const estimate = r.lampsPerFixture * r.ratedWattsPerLamp * estimatedBallastMultiplier(r.technology, r.ballast, r.ratedWattsPerLamp);
      expect(Math.abs(estimate - r.fixtureInputWatts) / r.fixtureInputWatts).toBeLessThan(0.02);
    }
  });
});

describe('invalid input throws a CalcInputError naming the field', () => {
  it.each([
    ['lampsPerFixture 0', fixture('linear-t8', 'electronic', 0, 32), 'existing.lampsPerFixture'],
    ['lampsPerFixture 2.5', fixture('linear-t8', 'electronic', 2.5, 32), 'existing.lampsPerFixture'],
    ['lampsPerFixture NaN', fixture('linear-t8', 'electronic', Number.NaN, 32), 'existing.lampsPerFixture'],
    ['ratedWattsPerLamp −32', fixture('linear-t8', 'electronic', 4, -32), 'existing.ratedWattsPerLamp'],
    ['ratedWattsPerLamp NaN', fixture('linear-t8', 'electronic', 4, Number.NaN), 'existing.ratedWattsPerLamp'],
    ['ratedWattsPerLamp Infinity', fixture('linear-t8', 'electronic', 4, Number.POSITIVE_INFINITY), 'existing.ratedWattsPerLamp'],
    ['fixtureInputWatts −1', fixture('linear-t8', 'electronic', 4, 32, { fixtureInputWatts: -1 }), 'existing.fixtureInputWatts'],
    ['fixtureInputWatts NaN', fixture('linear-t8', 'electronic', 4, 32, { fixtureInputWatts: Number.NaN }), 'existing.fixtureInputWatts'],
    ['meteredWattsPerFixture −5', fixture('linear-t8', 'electronic', 4, 32, { meteredWattsPerFixture: -5 }), 'existing.meteredWattsPerFixture'],
    ['meteredWattsPerFixture NaN', fixture('linear-t8', 'electronic', 4, 32, { meteredWattsPerFixture: Number.NaN }), 'existing.meteredWattsPerFixture'],
  ] as const)('%s', (_label, input, field) => {
    const error = inputError(() => existingFixtureWatts(input));
    expect(error.field).toBe(field);
    expect(error.message.startsWith(`${field}:`)).toBe(true);
  });

  it('says what was wrong: NaN is reported as NaN, not turned into a number', () => {
    expect(inputError(() => existingFixtureWatts(fixture('linear-t8', 'electronic', 4, Number.NaN))).problem).toMatch(/finite number.*NaN/);
    expect(inputError(() => existingFixtureWatts(fixture('linear-t8', 'electronic', 0, 32))).problem).toMatch(/between 1 and 24/);
  });
});

describe('mercury and PCBs', () => {
  it('fluorescent and HID lamps contain mercury (EPA: recycle as universal waste)', () => {
    for (const t of ['cfl-screw', 'cfl-pin', 'linear-t12', 'linear-t8', 'linear-t5', 'metal-halide', 'high-pressure-sodium', 'mercury-vapour'] as const) {
      expect(hasMercury(t), t).toBe(true);
    }
  });

  it('incandescent, halogen and LED do not', () => {
    for (const t of ['incandescent', 'halogen', 'led'] as const) expect(hasMercury(t), t).toBe(false);
    expect(mercuryTechnologies.size).toBe(8);
  });

  it('ballasts made through 1979 may contain PCBs (EPA 430-B-95-003; TSCA, 40 CFR 761)', () => {
    expect(lastPcbBallastYear).toBe(1979); // EPA 430-B-95-003 "Lighting Waste Disposal"; 40 CFR 761
  });
});
