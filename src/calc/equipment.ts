/**
 * Existing equipment: typical fixture input watts, lamp life and the rules
 * that decide which wattage figure a calculation uses.
 *
 * Input-watt figures come from published wattage tables (see
 * `typicalExistingEquipment` for the source of each row). Where a survey
 * gives neither metered nor fixture input watts and no table row matches, the
 * input is estimated from the lamp watts with a ballast multiplier derived
 * from those same tables, and the result says it was estimated.
 */
import type { BallastKind, Distribution, ExistingEquipment, ExistingTechnology } from '../survey/model.ts';
import { checkInteger, checkRange } from './errors.ts';

/** A common piece of existing equipment with its typical fixture input watts. */
export interface TypicalEquipment {
  key: string;
  label: string;
  technology: ExistingTechnology;
  ballast: BallastKind;
  lampsPerFixture: number;
  ratedWattsPerLamp: number;
  fixtureInputWatts: number;
  /** Where the input-watt figure comes from. */
  source: string;
}

const csu = 'Colorado State University Extension, "Business Lighting 101" (2017)';
const utilityTable = 'utility fixture wattage tables (typical HID and CFL input watts)';
const recalled = 'from memory: typical manufacturer ballast data, not confirmed against a published table';
const label = 'lamp label: incandescent and halogen lamps draw their rated watts';

/**
 * Common existing equipment, for the picker and for filling in input watts.
 * Rows marked "from memory" are recalled typical figures awaiting a published
 * source.
 */
export const typicalExistingEquipment: readonly TypicalEquipment[] = [
  { key: 'f40t12-4-mag', label: '4-lamp F40T12, magnetic ballast', technology: 'linear-t12', ballast: 'magnetic', lampsPerFixture: 4, ratedWattsPerLamp: 40, fixtureInputWatts: 172, source: csu },
  { key: 'f34t12-4-mag', label: '4-lamp F34T12, magnetic ballast', technology: 'linear-t12', ballast: 'magnetic', lampsPerFixture: 4, ratedWattsPerLamp: 34, fixtureInputWatts: 144, source: csu },
  { key: 'f32t8-4-elec', label: '4-lamp F32T8, electronic ballast', technology: 'linear-t8', ballast: 'electronic', lampsPerFixture: 4, ratedWattsPerLamp: 32, fixtureInputWatts: 113, source: csu },
  { key: 'f28t8-4-elec', label: '4-lamp F28T8, electronic ballast', technology: 'linear-t8', ballast: 'electronic', lampsPerFixture: 4, ratedWattsPerLamp: 28, fixtureInputWatts: 99, source: csu },
  { key: 'f32t8-3-elec', label: '3-lamp F32T8, electronic ballast', technology: 'linear-t8', ballast: 'electronic', lampsPerFixture: 3, ratedWattsPerLamp: 32, fixtureInputWatts: 88, source: recalled },
  { key: 'f32t8-2-elec', label: '2-lamp F32T8, electronic ballast', technology: 'linear-t8', ballast: 'electronic', lampsPerFixture: 2, ratedWattsPerLamp: 32, fixtureInputWatts: 59, source: recalled },
  { key: 'f32t8-1-elec', label: '1-lamp F32T8, electronic ballast', technology: 'linear-t8', ballast: 'electronic', lampsPerFixture: 1, ratedWattsPerLamp: 32, fixtureInputWatts: 31, source: recalled },
  { key: 'mh-400', label: 'Metal halide 400 W', technology: 'metal-halide', ballast: 'magnetic', lampsPerFixture: 1, ratedWattsPerLamp: 400, fixtureInputWatts: 458, source: utilityTable },
  { key: 'mh-250', label: 'Metal halide 250 W', technology: 'metal-halide', ballast: 'magnetic', lampsPerFixture: 1, ratedWattsPerLamp: 250, fixtureInputWatts: 295, source: utilityTable },
  { key: 'mh-175', label: 'Metal halide 175 W', technology: 'metal-halide', ballast: 'magnetic', lampsPerFixture: 1, ratedWattsPerLamp: 175, fixtureInputWatts: 215, source: utilityTable },
  { key: 'mh-150', label: 'Metal halide 150 W', technology: 'metal-halide', ballast: 'magnetic', lampsPerFixture: 1, ratedWattsPerLamp: 150, fixtureInputWatts: 190, source: utilityTable },
  { key: 'mh-100', label: 'Metal halide 100 W', technology: 'metal-halide', ballast: 'magnetic', lampsPerFixture: 1, ratedWattsPerLamp: 100, fixtureInputWatts: 128, source: utilityTable },
  { key: 'mh-70', label: 'Metal halide 70 W', technology: 'metal-halide', ballast: 'magnetic', lampsPerFixture: 1, ratedWattsPerLamp: 70, fixtureInputWatts: 95, source: utilityTable },
  { key: 'hps-250', label: 'High-pressure sodium 250 W', technology: 'high-pressure-sodium', ballast: 'magnetic', lampsPerFixture: 1, ratedWattsPerLamp: 250, fixtureInputWatts: 295, source: utilityTable },
  { key: 'cfl-pin-26', label: 'CFL 26 W pin-base downlight', technology: 'cfl-pin', ballast: 'electronic', lampsPerFixture: 1, ratedWattsPerLamp: 26, fixtureInputWatts: 26, source: utilityTable },
  { key: 'cfl-pin-42', label: 'CFL 42 W pin-base', technology: 'cfl-pin', ballast: 'electronic', lampsPerFixture: 1, ratedWattsPerLamp: 42, fixtureInputWatts: 48, source: utilityTable },
  { key: 'inc-40', label: 'Incandescent 40 W A-lamp', technology: 'incandescent', ballast: 'none', lampsPerFixture: 1, ratedWattsPerLamp: 40, fixtureInputWatts: 40, source: label },
  { key: 'inc-60', label: 'Incandescent 60 W A-lamp', technology: 'incandescent', ballast: 'none', lampsPerFixture: 1, ratedWattsPerLamp: 60, fixtureInputWatts: 60, source: label },
  { key: 'inc-75', label: 'Incandescent 75 W A-lamp', technology: 'incandescent', ballast: 'none', lampsPerFixture: 1, ratedWattsPerLamp: 75, fixtureInputWatts: 75, source: label },
  { key: 'inc-100', label: 'Incandescent 100 W A-lamp', technology: 'incandescent', ballast: 'none', lampsPerFixture: 1, ratedWattsPerLamp: 100, fixtureInputWatts: 100, source: label },
  { key: 'hal-par38-90', label: 'Halogen PAR38 90 W', technology: 'halogen', ballast: 'none', lampsPerFixture: 1, ratedWattsPerLamp: 90, fixtureInputWatts: 90, source: label },
  { key: 'hal-mr16-50', label: 'Halogen MR16 50 W (12 V transformer)', technology: 'halogen', ballast: 'none', lampsPerFixture: 1, ratedWattsPerLamp: 50, fixtureInputWatts: 50, source: label },
];

/**
 * Input-to-lamp-watts multipliers used when a fixture's input watts are not
 * known, derived from the published rows above: electronic linear
 * fluorescent 113 W / (4 × 32 W) = 0.883 (CSU 2017); magnetic linear
 * fluorescent 172 W / (4 × 40 W) = 1.075 (CSU 2017); pin-base CFL, the mean
 * of 26 W → 26 W and 42 W → 48 W (utility tables). HID ballast losses grow
 * as lamps get smaller, so HID is interpolated over the metal-halide rows.
 */
const ballastMultiplier = {
  none: 1,
  electronicLinear: 113 / 128,
  magneticLinear: 172 / 160,
  compactFluorescent: (26 / 26 + 48 / 42) / 2,
} as const;

/** Metal-halide rows (lamp watts, input watts) from the utility tables, ascending. */
const hidRows: readonly (readonly [number, number])[] = typicalExistingEquipment
  .filter((row) => row.technology === 'metal-halide')
  .map((row) => [row.ratedWattsPerLamp, row.fixtureInputWatts] as const)
  .sort((a, b) => a[0] - b[0]);

/** Input/lamp ratio of an HID lamp of `lampWatts`, interpolated over the published rows and held flat beyond them. */
function hidMultiplier(lampWatts: number): number {
  const first = hidRows[0]!;
  const last = hidRows[hidRows.length - 1]!;
  if (lampWatts <= first[0]) return first[1] / first[0];
  if (lampWatts >= last[0]) return last[1] / last[0];
  for (let i = 1; i < hidRows.length; i++) {
    const [w1, in1] = hidRows[i]!;
    if (lampWatts <= w1) {
      const [w0, in0] = hidRows[i - 1]!;
      const r0 = in0 / w0;
      const r1 = in1 / w1;
      return r0 + ((r1 - r0) * (lampWatts - w0)) / (w1 - w0);
    }
  }
  return last[1] / last[0];
}

/** Technologies that cannot run without a ballast or driver. */
const ballastedTechnologies: ReadonlySet<ExistingTechnology> = new Set([
  'cfl-pin',
  'linear-t12',
  'linear-t8',
  'linear-t5',
  'metal-halide',
  'high-pressure-sodium',
  'mercury-vapour',
]);

const hidTechnologies: ReadonlySet<ExistingTechnology> = new Set(['metal-halide', 'high-pressure-sodium', 'mercury-vapour']);

/** Lamp technologies that contain mercury (fluorescent and HID). */
export const mercuryTechnologies: ReadonlySet<ExistingTechnology> = new Set([
  'cfl-screw',
  'cfl-pin',
  'linear-t12',
  'linear-t8',
  'linear-t5',
  'metal-halide',
  'high-pressure-sodium',
  'mercury-vapour',
]);

/** Where the watts used for an existing fixture came from. */
export type WattsBasis = 'metered' | 'fixture-input' | 'table' | 'lamp-rated' | 'estimated';

export interface ExistingWatts {
  wattsPerFixture: number;
  basis: WattsBasis;
  /** Lamps × rated watts, for comparing with metered watts. */
  ratedLampWatts: number;
  /** The best rated figure (fixture input, table row or estimate), ignoring a meter reading. */
  ratedFixtureWatts: number;
}

/** Finds the table row for this technology, ballast, lamp count and lamp watts, if any. */
export function findTypicalEquipment(
  technology: ExistingTechnology,
  ballast: BallastKind,
  lampsPerFixture: number,
  ratedWattsPerLamp: number,
): TypicalEquipment | undefined {
  return typicalExistingEquipment.find(
    (row) =>
      row.technology === technology &&
      row.ballast === ballast &&
      row.lampsPerFixture === lampsPerFixture &&
      row.ratedWattsPerLamp === ratedWattsPerLamp,
  );
}

/**
 * The watts one existing fixture draws. A metered reading wins over every
 * rated figure; then the fixture input watts the user gave; then a published
 * table row; then an estimate from the lamp watts and a ballast multiplier.
 *
 * @example
 * existingFixtureWatts({ technology: 'linear-t8', ballast: 'electronic', lampsPerFixture: 4, ratedWattsPerLamp: 32, … })
 * //=> { wattsPerFixture: 113, basis: 'table', ratedLampWatts: 128, ratedFixtureWatts: 113 }
 */
export function existingFixtureWatts(
  existing: Pick<
    ExistingEquipment,
    'technology' | 'ballast' | 'lampsPerFixture' | 'ratedWattsPerLamp' | 'fixtureInputWatts' | 'meteredWattsPerFixture'
  >,
): ExistingWatts {
  checkInteger('existing.lampsPerFixture', existing.lampsPerFixture, 1, 24);
  checkRange('existing.ratedWattsPerLamp', existing.ratedWattsPerLamp, 0, 100_000);
  const ratedLampWatts = existing.lampsPerFixture * existing.ratedWattsPerLamp;
  let ratedFixtureWatts: number;
  let basis: WattsBasis;
  if (existing.fixtureInputWatts !== undefined) {
    ratedFixtureWatts = checkRange('existing.fixtureInputWatts', existing.fixtureInputWatts, 0, 100_000);
    basis = 'fixture-input';
  } else {
    const row = findTypicalEquipment(existing.technology, existing.ballast, existing.lampsPerFixture, existing.ratedWattsPerLamp);
    if (row) {
      ratedFixtureWatts = row.fixtureInputWatts;
      basis = 'table';
    } else {
      ratedFixtureWatts = ratedLampWatts * estimatedBallastMultiplier(existing.technology, existing.ballast, existing.ratedWattsPerLamp);
      basis = existing.ballast === 'none' && !ballastedTechnologies.has(existing.technology) ? 'lamp-rated' : 'estimated';
    }
  }
  if (existing.meteredWattsPerFixture !== undefined) {
    const metered = checkRange('existing.meteredWattsPerFixture', existing.meteredWattsPerFixture, 0, 100_000);
    return { wattsPerFixture: metered, basis: 'metered', ratedLampWatts, ratedFixtureWatts };
  }
  return { wattsPerFixture: ratedFixtureWatts, basis, ratedLampWatts, ratedFixtureWatts };
}

/**
 * The input/lamp-watts multiplier assumed when nothing better is known. A
 * ballasted technology recorded with ballast "none" is treated as having an
 * unknown (magnetic) ballast, the heavier case.
 *
 * @example estimatedBallastMultiplier('metal-halide', 'magnetic', 400) //=> 1.145
 */
export function estimatedBallastMultiplier(technology: ExistingTechnology, ballast: BallastKind, ratedWattsPerLamp: number): number {
  if (!ballastedTechnologies.has(technology)) return ballastMultiplier.none;
  if (hidTechnologies.has(technology)) return hidMultiplier(ratedWattsPerLamp);
  if (technology === 'cfl-pin') return ballastMultiplier.compactFluorescent;
  return ballast === 'electronic' ? ballastMultiplier.electronicLinear : ballastMultiplier.magneticLinear;
}

/**
 * Typical rated lamp life in hours by technology — from memory: manufacturer
 * catalogue figures typical of each technology (50 % survival), not a single
 * published table. Users override per entry.
 */
export const typicalLampLifeHours: Readonly<Record<ExistingTechnology, number>> = {
  incandescent: 1_000,
  halogen: 2_500,
  'cfl-screw': 10_000,
  'cfl-pin': 12_000,
  'linear-t12': 20_000,
  'linear-t8': 24_000,
  'linear-t5': 25_000,
  'metal-halide': 15_000,
  'high-pressure-sodium': 24_000,
  'mercury-vapour': 24_000,
  led: 50_000,
  other: 10_000,
};

/** Ballasts made through 1979 may contain PCBs (EPA 430-B-95-003; TSCA, 40 CFR 761). */
export const lastPcbBallastYear = 1979;

/** True when the existing lamps are linear or compact fluorescent, or HID. */
export function hasMercury(technology: ExistingTechnology): boolean {
  return mercuryTechnologies.has(technology);
}

/**
 * Typical share of lamp lumens that leaves the existing housing, by
 * technology — from memory: rough luminaire efficiencies of common housings
 * (lensed or louvred fluorescent troffers and strips about 0.7, CFL
 * downlights about 0.6, HID high-bays about 0.75, open or shaded screw-base
 * fittings about 0.8). Used so that a proposed luminaire's delivered lumens
 * are compared with what the old fixture delivers, not with bare-lamp lumens.
 */
export const typicalLuminaireEfficiency: Readonly<Record<ExistingTechnology, number>> = {
  incandescent: 0.8,
  halogen: 0.8,
  'cfl-screw': 0.8,
  'cfl-pin': 0.6,
  'linear-t12': 0.7,
  'linear-t8': 0.7,
  'linear-t5': 0.7,
  'metal-halide': 0.75,
  'high-pressure-sodium': 0.75,
  'mercury-vapour': 0.75,
  led: 0.85,
  other: 0.7,
};

/**
 * The light distribution assumed for an existing fixture, by technology —
 * common practice, no published source: linear fluorescent in troffers and
 * wraps (direct-wide), HID high-bays and pin-base CFL downlights
 * (direct-narrow), screw-base lamps in shades and globes (diffuse).
 */
export const typicalExistingDistribution: Readonly<Record<ExistingTechnology, Distribution>> = {
  incandescent: 'diffuse',
  halogen: 'diffuse',
  'cfl-screw': 'diffuse',
  'cfl-pin': 'direct-narrow',
  'linear-t12': 'direct-wide',
  'linear-t8': 'direct-wide',
  'linear-t5': 'direct-wide',
  'metal-halide': 'direct-narrow',
  'high-pressure-sodium': 'direct-narrow',
  'mercury-vapour': 'direct-narrow',
  led: 'direct-wide',
  other: 'direct-wide',
};
