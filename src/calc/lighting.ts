/**
 * Light-quantity checks for a retrofit: how many lumens an old lamp gave,
 * whether the proposed product gives about as much, and what average
 * illuminance a room gets by the lumen (zonal cavity) method.
 *
 * Sources:
 * - Incandescent lumen equivalence: US DOE "Lumens and the Lighting Facts
 *   Label" and the FTC lamp-labelling rule 16 CFR Part 305
 *   (40 W ≈ 450 lm, 60 W ≈ 800 lm, 75 W ≈ 1,100 lm, 100 W ≈ 1,600 lm,
 *   150 W ≈ 2,600 lm).
 * - Lumen method and cavity ratio: IES zonal cavity method,
 *   E = Φ × CU × LLF / A, RCR = 5 h (L + W) / (L W), LLF = BF × LLD × LDD × RSDD
 *   (IES definition "cavity ratio, CR"; IES Lighting Handbook, lighting
 *   calculations chapter).
 * - Coefficient-of-utilisation table: FROM MEMORY, an approximation of the
 *   shape of published CU tables for typical luminaires at effective
 *   reflectances ceiling 80 % / walls 50 % / floor 20 %. No manufacturer-
 *   neutral published table could be read for this work. Cross-checks: the
 *   direct-narrow row stays within 0.03 of a published manufacturer
 *   photometric report for a reflector-lamp downlight (Lightolier C4P20D,
 *   1999, 80/50/20 column: 0.95 at RCR 1 falling to 0.58 at RCR 10). The
 *   worked example in the Photometric Toolbox documentation ("Reading the CU
 *   Table", an unnamed luminaire: 0.46 at RCR 2, 0.40 at RCR 3) sits a
 *   little below even our indirect row, a reminder of how far real products
 *   spread. Treat the result as a rough estimate: a CU read from the chosen
 *   product's own photometric report (the room's CU override) always wins.
 * - Ballast factors and lamp lumen depreciation defaults: from memory unless
 *   a row says otherwise; every one can be overridden per entry.
 */
import type { BallastKind, Distribution, ExistingTechnology } from '../survey/model.ts';
import { CalcInputError, checkRange } from './errors.ts';

/** Upper bound for a single lamp's rated watts (largest general-service lamps are 1,500 W). */
const maxLampWatts = 2000;
/** Upper bound for any lumen figure (a whole building stays far below). */
const maxLumens = 1e9;
/** Upper bound for a room dimension in metres. */
const maxMetres = 10_000;
/** Upper bound for a floor area in square metres. */
const maxSquareMetres = 1e7;
/** Upper bound for connected watts in one room or floor. */
const maxWatts = 1e8;

/** Like checkRange, but 0 itself is refused too. */
function checkPositive(field: string, value: number, max: number): number {
  checkRange(field, value, 0, max);
  if (value <= 0) throw new CalcInputError(field, `must be greater than 0 (got ${value})`);
  return value;
}

// ---------------------------------------------------------------------------
// Incandescent lumen equivalence
// ---------------------------------------------------------------------------

/**
 * Rated watts → typical initial lumens of a general-service incandescent lamp,
 * as printed on US packaging (US DOE "Lumens and the Lighting Facts Label";
 * FTC 16 CFR Part 305).
 */
export const incandescentEquivalencePoints: readonly (readonly [watts: number, lumens: number])[] = [
  [40, 450],
  [60, 800],
  [75, 1100],
  [100, 1600],
  [150, 2600],
];

/**
 * Typical initial lumens of an incandescent or halogen lamp from its rated
 * watts, by linear interpolation between the DOE/FTC equivalence points.
 * Below 40 W the light is taken as proportional to watts from the 40 W point
 * (450/40 = 11.25 lm/W); above 150 W the last segment's slope (20 lm/W) is
 * carried on. Both ends are documented choices, not published figures.
 *
 * @example incandescentEquivalentLumens(60) //=> 800
 */
export function incandescentEquivalentLumens(ratedWatts: number): number {
  checkRange('ratedWatts', ratedWatts, 0, maxLampWatts);
  const points = incandescentEquivalencePoints;
  const first = points[0];
  const last = points[points.length - 1];
  const beforeLast = points[points.length - 2];
  if (!first || !last || !beforeLast) throw new Error('incandescent equivalence table is empty');
  if (ratedWatts <= first[0]) return (ratedWatts * first[1]) / first[0];
  if (ratedWatts >= last[0]) {
    const slope = (last[1] - beforeLast[1]) / (last[0] - beforeLast[0]);
    return last[1] + slope * (ratedWatts - last[0]);
  }
  for (let i = 1; i < points.length; i += 1) {
    const lo = points[i - 1];
    const hi = points[i];
    if (lo && hi && ratedWatts <= hi[0]) {
      return lo[1] + ((ratedWatts - lo[0]) * (hi[1] - lo[1])) / (hi[0] - lo[0]);
    }
  }
  throw new Error('unreachable: ratedWatts lies inside the equivalence table');
}

// ---------------------------------------------------------------------------
// Lumen comparison
// ---------------------------------------------------------------------------

/**
 * Proposed lumens over existing lumens; `null` when the existing figure is 0
 * (nothing to compare against).
 *
 * @example lumenRatio(900, 800) //=> 1.125
 */
export function lumenRatio(proposedLumens: number, existingLumens: number): number | null {
  checkRange('proposedLumens', proposedLumens, 0, maxLumens);
  checkRange('existingLumens', existingLumens, 0, maxLumens);
  if (existingLumens === 0) return null;
  return proposedLumens / existingLumens;
}

/** How a proposed product's light compares with what it replaces. */
export type LumenVerdict = 'short' | 'ok' | 'over';

/** Accepted range of proposed/existing lumen ratios (both ends inclusive). */
export interface LumenBand {
  minRatio: number;
  maxRatio: number;
}

/**
 * Default band: within 85 %–130 % of the existing lumens counts as a like-for-
 * like swap. Common practice, no published source.
 */
export const defaultLumenBand: Readonly<LumenBand> = Object.freeze({ minRatio: 0.85, maxRatio: 1.3 });

/**
 * Judges a proposed/existing lumen ratio against a band: below the band is
 * `short`, above it `over`, inside it (ends included) `ok`.
 *
 * @example judgeLumens(0.5625) //=> 'short'
 */
export function judgeLumens(ratio: number, band: LumenBand = defaultLumenBand): LumenVerdict {
  checkRange('ratio', ratio, 0, Number.MAX_VALUE);
  checkRange('band.minRatio', band.minRatio, 0, Number.MAX_VALUE);
  checkRange('band.maxRatio', band.maxRatio, 0, Number.MAX_VALUE);
  if (band.maxRatio < band.minRatio) {
    throw new CalcInputError('band.maxRatio', `must not be below band.minRatio (${band.maxRatio} < ${band.minRatio})`);
  }
  if (ratio < band.minRatio) return 'short';
  if (ratio > band.maxRatio) return 'over';
  return 'ok';
}

// ---------------------------------------------------------------------------
// Lumen (zonal cavity) method
// ---------------------------------------------------------------------------

/**
 * Room cavity ratio of a rectangular room, RCR = 5·h·(L + W)/(L·W), where h
 * is the height from the work plane to the luminaires (IES zonal cavity
 * method). Dimensionless: any length unit gives the same result as long as
 * all three use it.
 *
 * @example roomCavityRatio(12, 6, 2.2) //=> 2.75
 */
export function roomCavityRatio(lengthMetres: number, widthMetres: number, cavityHeightMetres: number): number {
  checkPositive('lengthMetres', lengthMetres, maxMetres);
  checkPositive('widthMetres', widthMetres, maxMetres);
  checkRange('cavityHeightMetres', cavityHeightMetres, 0, maxMetres);
  return (5 * cavityHeightMetres * (lengthMetres + widthMetres)) / (lengthMetres * widthMetres);
}

/** CU at RCR 0, 1, …, 10. */
export type CuRow = readonly [number, number, number, number, number, number, number, number, number, number, number];

/**
 * Coefficients of utilisation for a typical luminaire of each distribution
 * class at effective reflectances ceiling 80 % / walls 50 % / floor 20 %,
 * RCR 0 to 10. FROM MEMORY — an approximation of published typical-luminaire
 * tables, not a transcription (see the file header). Each row falls with RCR,
 * and at every RCR a more downward, more concentrated class utilises more of
 * its lamp lumens. Assumed luminaires:
 * - direct-narrow: specular-reflector downlight or high-bay, ~80 % efficient;
 * - direct-wide: lensed or parabolic troffer, ~70 % efficient;
 * - semi-direct: wraparound or pendant with 10–40 % uplight;
 * - diffuse: general-diffuse pendant or enclosed globe;
 * - indirect: pendant or cove sending 90–100 % of its light up.
 */
export const coefficientOfUtilisationTable: Readonly<Record<Distribution, CuRow>> = Object.freeze({
  'direct-narrow': [0.97, 0.92, 0.87, 0.82, 0.77, 0.73, 0.69, 0.65, 0.61, 0.58, 0.55],
  'direct-wide': [0.83, 0.76, 0.69, 0.63, 0.57, 0.52, 0.48, 0.44, 0.4, 0.37, 0.34],
  'semi-direct': [0.82, 0.72, 0.64, 0.57, 0.51, 0.46, 0.41, 0.37, 0.34, 0.31, 0.28],
  diffuse: [0.8, 0.68, 0.58, 0.5, 0.44, 0.39, 0.34, 0.3, 0.27, 0.24, 0.21],
  indirect: [0.66, 0.56, 0.48, 0.42, 0.36, 0.32, 0.28, 0.25, 0.22, 0.19, 0.17],
} satisfies Record<Distribution, CuRow>);

/**
 * Efficiency of the typical luminaire each CU row assumes: direct-narrow 0.8
 * and direct-wide 0.7 as stated above; semi-direct 0.75, diffuse 0.75 and
 * indirect 0.7 from memory (typical of those housings). Used to turn a
 * lamp-lumen CU into one for lumens leaving the luminaire.
 */
export const cuTableLuminaireEfficiency: Readonly<Record<Distribution, number>> = Object.freeze({
  'direct-narrow': 0.8,
  'direct-wide': 0.7,
  'semi-direct': 0.75,
  diffuse: 0.75,
  indirect: 0.7,
} satisfies Record<Distribution, number>);

function cuAt(row: CuRow, index: number): number {
  const value = row[index];
  if (value === undefined) throw new Error(`CU table has no entry at RCR ${index}`);
  return value;
}

/**
 * Coefficient of utilisation for a distribution class and room cavity ratio,
 * read from {@link coefficientOfUtilisationTable} (80/50/20 reflectances) with
 * linear interpolation between whole RCRs; above RCR 10 the RCR 10 value is
 * used. An approximation: prefer the product's own CU when known.
 *
 * @example coefficientOfUtilisation('direct-wide', 2.5) //=> 0.66 (to rounding)
 */
export function coefficientOfUtilisation(distribution: Distribution, rcr: number): number {
  if (typeof distribution !== 'string' || !Object.hasOwn(coefficientOfUtilisationTable, distribution)) {
    throw new CalcInputError('distribution', `"${String(distribution)}" is not a known distribution class`);
  }
  checkRange('roomCavityRatio', rcr, 0, Number.MAX_VALUE);
  const row = coefficientOfUtilisationTable[distribution];
  const lastIndex = row.length - 1;
  if (rcr >= lastIndex) return cuAt(row, lastIndex);
  const lower = Math.floor(rcr);
  const fraction = rcr - lower;
  const a = cuAt(row, lower);
  if (fraction === 0) return a;
  const b = cuAt(row, lower + 1);
  return a + fraction * (b - a);
}

/**
 * Default ballast factor by ballast kind, for when the label is unreadable.
 * `none` is 1 by definition (lamp at its rated output). Electronic 0.88
 * (normal-light-output instant-start electronic ballast for T8 lamps) and
 * magnetic 0.95 (standard magnetic ballast for F40T12 lamps) are from memory;
 * the ballast's own label or catalogue figure wins.
 *
 * @example ballastFactorDefault('electronic') //=> 0.88
 */
export function ballastFactorDefault(ballast: BallastKind): number {
  switch (ballast) {
    case 'none':
      return 1;
    case 'electronic':
      return 0.88; // from memory
    case 'magnetic':
      return 0.95; // from memory
    default:
      throw new CalcInputError('ballast', `"${String(ballast)}" is not a known ballast kind`);
  }
}

const lampLumenDepreciation: Readonly<Record<ExistingTechnology, number>> = Object.freeze({
  incandescent: 0.9, // from memory
  halogen: 0.95, // from memory
  'cfl-screw': 0.85, // from memory
  'cfl-pin': 0.85, // from memory
  'linear-t12': 0.87, // from memory (halophosphate lamps fall off faster than T8)
  // Graybar, "How to Determine Lamp Lumen Depreciation": typical fluorescents
  // lose 5–10 % over 8,000–10,000 h.
  'linear-t8': 0.93,
  'linear-t5': 0.93,
  // Same Graybar article: 400 W metal halide loses 25–30 % over 8,000–10,000 h.
  'metal-halide': 0.72,
  'high-pressure-sodium': 0.9, // from memory
  'mercury-vapour': 0.75, // from memory
  led: 0.85, // from memory; a mid-life figure for products rated to L70
  other: 0.85, // from memory; cautious middle value
} satisfies Record<ExistingTechnology, number>);

/**
 * Default lamp lumen depreciation (light at the design point over initial
 * light) by technology. Mostly from memory (see the table comments); the
 * product's own mean-lumen or lumen-maintenance figure wins.
 *
 * @example lampLumenDepreciationDefault('metal-halide') //=> 0.72
 */
export function lampLumenDepreciationDefault(technology: ExistingTechnology | 'led'): number {
  if (typeof technology !== 'string' || !Object.hasOwn(lampLumenDepreciation, technology)) {
    throw new CalcInputError('technology', `"${String(technology)}" is not a known lamp technology`);
  }
  return lampLumenDepreciation[technology];
}

/** The parts of the total light loss factor used here. */
export interface LightLossInputs {
  /** Ballast factor 0.3–1.5 (1 for lamps and LED products without a ballast). */
  ballastFactor: number;
  /** Lamp lumen depreciation, above 0 and at most 1. */
  lampLumenDepreciation: number;
  /** Luminaire dirt depreciation, above 0 and at most 1. */
  luminaireDirtDepreciation: number;
  /** Room surface dirt depreciation, above 0 and at most 1. */
  roomSurfaceDirtDepreciation: number;
}

/**
 * Total light loss factor LLF = BF × LLD × LDD × RSDD (IES lumen method).
 *
 * @example lightLossFactor({ ballastFactor: 0.88, lampLumenDepreciation: 0.9, luminaireDirtDepreciation: 0.9, roomSurfaceDirtDepreciation: 0.95 }) //=> 0.67716 (to rounding)
 */
export function lightLossFactor(f: LightLossInputs): number {
  checkRange('ballastFactor', f.ballastFactor, 0.3, 1.5);
  checkPositive('lampLumenDepreciation', f.lampLumenDepreciation, 1);
  checkPositive('luminaireDirtDepreciation', f.luminaireDirtDepreciation, 1);
  checkPositive('roomSurfaceDirtDepreciation', f.roomSurfaceDirtDepreciation, 1);
  return f.ballastFactor * f.lampLumenDepreciation * f.luminaireDirtDepreciation * f.roomSurfaceDirtDepreciation;
}

/**
 * Average maintained illuminance on the work plane by the lumen method,
 * E = Φ × CU × LLF / A, in lux (lumens per square metre). Φ is the total
 * initial lamp (or LED product) lumens in the room.
 *
 * @example maintainedIlluminanceLux(52_500, 0.6, 0.8, 50) //=> 504
 */
export function maintainedIlluminanceLux(
  totalInitialLumens: number,
  cu: number,
  llf: number,
  floorSquareMetres: number,
): number {
  checkRange('totalInitialLumens', totalInitialLumens, 0, maxLumens);
  checkRange('coefficientOfUtilisation', cu, 0, 1.5);
  checkRange('lightLossFactor', llf, 0, 1.5);
  checkPositive('floorSquareMetres', floorSquareMetres, maxSquareMetres);
  return (totalInitialLumens * cu * llf) / floorSquareMetres;
}

/**
 * Lighting power density: connected watts over floor area, in W/m².
 *
 * @example lightingPowerDensityWattsPerSquareMetre(148, 18.580608) //=> 7.9652… (0.74 W/ft²)
 */
export function lightingPowerDensityWattsPerSquareMetre(watts: number, floorSquareMetres: number): number {
  checkRange('watts', watts, 0, maxWatts);
  checkPositive('floorSquareMetres', floorSquareMetres, maxSquareMetres);
  return watts / floorSquareMetres;
}

/**
 * Coefficient of utilisation for lumens that leave the luminaire (absolute
 * photometry, as LED luminaires are rated): the table CU, which is relative to
 * lamp lumens in a typical housing, divided by that housing's efficiency
 * ({@link cuTableLuminaireEfficiency}). Multiplying a fluorescent fixture's
 * lamp lumens × housing efficiency by this CU gives back the classic
 * lamp-lumen result.
 *
 * @example coefficientOfUtilisationForLuminaireLumens('direct-wide', 0) //=> 1.1857… (0.83 / 0.7)
 */
export function coefficientOfUtilisationForLuminaireLumens(distribution: Distribution, rcr: number): number {
  return coefficientOfUtilisation(distribution, rcr) / cuTableLuminaireEfficiency[distribution];
}
