/**
 * Automatic product choice: for each fixture entry, the catalog product with
 * the lowest life-cycle cost that meets every constraint of the fixture, with
 * a one-line reason for every product turned down. Nothing changes in the
 * survey until the user accepts a choice ({@link applyChoices}).
 *
 * Constraints (each has a stable {@link ChoiceReason} code; codes never change
 * meaning once released):
 * - the product's form fits the existing equipment ({@link formsFitting});
 * - enough light: lumens leaving the fixture against today's, by the same
 *   85–130 % band the `lumens-short` / `lumens-over` warnings use, or the
 *   room's maintained illuminance against its IES target by the lumen method
 *   (80–150 %, the `illuminance-short` / `illuminance-over` thresholds), with
 *   this product in place of the entry's current proposal (see {@link LightRule});
 * - ratings: dimmable on a dimmed circuit, enclosed-rated in a totally enclosed
 *   fixture, moisture rating at least the location's, IC-rated for a new
 *   luminaire touching insulation, emergency listing on an emergency circuit —
 *   the same rules as the warnings (`ratingRules` in `warnings.ts`);
 * - CRI at least the space's minimum (`minimumCri` in `warnings.ts`);
 * - CCT within the ANSI C78.377 tolerance of the room's preferred nominal CCT;
 * - the circuit voltage inside the product's rated input range, when recorded;
 * - linear tubes: Type A needs a ballast it can run on;
 * - retired products are never chosen.
 *
 * Life-cycle cost (LCC) of a product for an entry, over the survey's analysis
 * period in real terms (NIST Handbook 135):
 *   LCC = net first cost (materials + labour + disposal, with markup and tax,
 *         less rebates; `projectCost`)
 *       + PV of the proposed side's energy and demand cost (escalating:
 *         UPV*(d, e, n) / (1 + e), as `analyseInvestment` discounts savings)
 *       + PV of its lamp replacements (levelised lamps × hours / life ×
 *         (price + relamp labour); `relampCostPerYear`, UPV(d, n)).
 * Energy and demand use the survey's savings factors exactly as
 * `calculateSurvey` does, so for every product
 *   LCC = PV(existing side's operating cost) − NS,
 * where NS is the net savings `calculateSurvey` reports with that product
 * proposed (tests/calc/choice.test.ts checks this to 1e-9).
 *
 * Ties: lowest LCC, then more lumens leaving the fixture, then product id.
 *
 * Speed: per-product and per-entry facts are computed once; the entry ×
 * product loop is arithmetic on them. Messages are built only for the best
 * and current products; the full candidate list of an entry is built when it
 * is first read (or use {@link explainEntry}).
 */
import type {
  CatalogProduct,
  Distribution,
  ExistingTechnology,
  FixtureConditions,
  FixtureEntry,
  ProductForm,
  ProposedProduct,
  Room,
  Survey,
  TubeType,
} from '../survey/model.ts';
import { projectCost, relampCostPerYear } from './costs.ts';
import { escalatedUniformPresentValueFactor, uniformPresentValueFactor } from './economics.ts';
import { annualHours, controlSavingsFraction } from './energy.ts';
import { hasMercury, typicalExistingDistribution } from './equipment.ts';
import { CalcInputError, checkInteger, checkRange } from './errors.ts';
import {
  ballastFactorDefault,
  coefficientOfUtilisationForLuminaireLumens,
  defaultLumenBand,
  lampLumenDepreciationDefault,
  roomCavityRatio,
  type LumenBand,
} from './lighting.ts';
import { proposalFromProduct } from './proposal.ts';
import { spaceFacts, targetLux } from './spaces.ts';
import { checkMoney, defaultDirtDepreciation, existingLumensPerFixture, floorOf, housingEfficiency as housingEfficiencyOf, surveyFactors } from './survey.ts';
import { displayUnits, toDisplay } from './units.ts';
import { minimumCri, moistureRank, ratingRules, safetyDeferral, warningThresholds, type RatedProduct } from './warnings.ts';

// ---------------------------------------------------------------------------
// Public types (the screens read these; keep them stable)

/** Why a product was turned down for a fixture. Stable codes. */
export type ChoiceReason =
  | 'retired'
  | 'not-calculable'
  | 'form-mismatch'
  | 'not-dimmable'
  | 'dimmer-kind'
  | 'not-enclosed-rated'
  | 'moisture-rating'
  | 'not-emergency-listed'
  | 'not-ic-rated'
  | 'tube-needs-ballast'
  | 'tube-on-magnetic-ballast'
  | 'tube-type-unknown'
  | 'voltage-mismatch'
  | 'cri-too-low'
  | 'cct-mismatch'
  | 'too-little-light'
  | 'too-much-light'
  | 'room-under-target'
  | 'room-over-target';

/** Something to know about a product that is not a reason to turn it down. Stable codes. */
export type ChoiceNote =
  | 'voltage-unknown'
  | 'light-unknown'
  | 'light-by-room'
  | 'ballast-bypass'
  | 'fixture-rewired'
  | 'ballast-compatibility'
  | 'dimmer-compatibility'
  | 'insulation-contact'
  | 'hid-lamp-wiring'
  | 'emergency-circuit'
  | 'more-light-than-needed';

export interface ChoiceReasonItem {
  code: ChoiceReason;
  /** One line about this fixture, e.g. "not rated for enclosed fixtures". */
  message: string;
}

export interface ChoiceNoteItem {
  code: ChoiceNote;
  message: string;
  /** Wiring, heat or life safety: the message ends with the sentence deferring to local codes and a licensed electrician. */
  safety: boolean;
}

/** One product judged for one entry. */
export interface CandidateOutcome {
  /** Catalog id; null only for an entry's typed-in (non-catalog) current proposal. */
  productId: string | null;
  name: string;
  /** True when it meets every constraint. */
  accepted: boolean;
  /** LCC of all the entry's fixtures over the analysis period, in the survey currency; null when the product cannot be calculated. */
  lifeCycleCost: number | null;
  /** LCC of one fixture (the ranking key). */
  lifeCycleCostPerFixture: number | null;
  /** Initial lumens leaving one fixture with this product. */
  lumensPerFixture: number;
  /** Why it is turned down (empty when accepted). */
  reasons: ChoiceReasonItem[];
  /** Cautions and checks that do not turn it down. */
  notes: ChoiceNoteItem[];
  /** What the entry's proposal becomes if this product is accepted. */
  proposal: ProposedProduct;
}

export interface EntryChoice {
  entryId: string;
  roomId: string;
  roomName: string;
  description: string;
  count: number;
  /** The accepted product with the lowest LCC; null when nothing in the catalog fits. */
  best: CandidateOutcome | null;
  /** The entry's current proposal judged the same way; null when none. Built when first read. */
  current: CandidateOutcome | null;
  /** Every catalog product: accepted ones by LCC (then lumens, then id), then the rejected ones. Built when first read. */
  candidates: CandidateOutcome[];
  /** True when there is a best product and it differs from the current proposal. */
  changed: boolean;
}

export interface ChoiceCounts {
  /** Entries judged. */
  entries: number;
  /** Entries with a product that fits. */
  withChoice: number;
  /** Entries whose best product differs from their current proposal. */
  changed: number;
  /** Entries for which nothing in the catalog fits. */
  noFit: number;
  /** Products in the catalog, and how many of them are retired. */
  products: number;
  retiredProducts: number;
}

export interface SurveyChoice {
  surveyId: string;
  currency: string;
  analysisYears: number;
  lightRule: LightRule;
  entries: EntryChoice[];
  counts: ChoiceCounts;
}

/**
 * How "enough light" is judged.
 * - `fixture-first` (default): lumens leaving the fixture against today's
 *   when today's are known; otherwise the room against its target.
 * - `room-first`: the room against its target when the lumen method can be
 *   run (every other fixture's lumens known); otherwise per fixture. Lets an
 *   over-lit room take a dimmer product.
 */
export type LightRule = 'fixture-first' | 'room-first';

export interface ChoiceOptions {
  lightRule?: LightRule;
  /** Per-fixture lumen band; default the warnings' band (85–130 %). */
  lumenBand?: LumenBand;
  /** Judge only these entries (ids); default every entry. Unknown ids are an error. */
  entryIds?: readonly string[];
}

// ---------------------------------------------------------------------------
// Facts of the trade used here

/**
 * Product forms that fit each kind of existing equipment. Common practice,
 * no published source: a screw-base socket takes a screw-in LED lamp; a
 * pin-base CFL socket a pin-base LED lamp; a linear fluorescent fixture an
 * LED tube; a new luminaire or a retrofit kit can replace anything. An HID
 * fixture (metal halide, sodium, mercury) also takes a screw-in (mogul or
 * medium base) LED replacement lamp, with a wiring caution (see
 * {@link ChoiceNote} `hid-lamp-wiring`). For LED or unrecorded equipment only
 * a new luminaire or kit is proposed, since the socket is not known.
 */
export const formsFitting: Readonly<Record<ExistingTechnology, readonly ProductForm[]>> = {
  incandescent: ['screw-lamp', 'luminaire', 'retrofit-kit'],
  halogen: ['screw-lamp', 'luminaire', 'retrofit-kit'],
  'cfl-screw': ['screw-lamp', 'luminaire', 'retrofit-kit'],
  'cfl-pin': ['pin-lamp', 'luminaire', 'retrofit-kit'],
  'linear-t12': ['linear-tube', 'luminaire', 'retrofit-kit'],
  'linear-t8': ['linear-tube', 'luminaire', 'retrofit-kit'],
  'linear-t5': ['linear-tube', 'luminaire', 'retrofit-kit'],
  'metal-halide': ['screw-lamp', 'luminaire', 'retrofit-kit'],
  'high-pressure-sodium': ['screw-lamp', 'luminaire', 'retrofit-kit'],
  'mercury-vapour': ['screw-lamp', 'luminaire', 'retrofit-kit'],
  led: ['luminaire', 'retrofit-kit'],
  other: ['luminaire', 'retrofit-kit'],
};

const hidTechnologies: ReadonlySet<ExistingTechnology> = new Set(['metal-halide', 'high-pressure-sodium', 'mercury-vapour']);

/**
 * ANSI C78.377 nominal CCTs with their target CCT and tolerance, kelvin
 * (from memory: the 2017 edition's Table 1 quadrangles; verify against the
 * standard).
 */
export const ansiNominalCct: readonly { nominalKelvin: number; targetKelvin: number; toleranceKelvin: number }[] = [
  { nominalKelvin: 2700, targetKelvin: 2725, toleranceKelvin: 145 },
  { nominalKelvin: 3000, targetKelvin: 3045, toleranceKelvin: 175 },
  { nominalKelvin: 3500, targetKelvin: 3465, toleranceKelvin: 245 },
  { nominalKelvin: 4000, targetKelvin: 3985, toleranceKelvin: 275 },
  { nominalKelvin: 4500, targetKelvin: 4503, toleranceKelvin: 243 },
  { nominalKelvin: 5000, targetKelvin: 5029, toleranceKelvin: 283 },
  { nominalKelvin: 5700, targetKelvin: 5667, toleranceKelvin: 355 },
  { nominalKelvin: 6500, targetKelvin: 6532, toleranceKelvin: 510 },
];

/**
 * The CCT band a product must fall in for a preferred nominal CCT: the ANSI
 * C78.377 bin when the preference is one of its nominal values; otherwise
 * the standard's "flexible CCT" rule, target = the preference rounded to
 * 100 K, tolerance ΔT = 1.1900e-8·T³ − 1.5434e-4·T² + 0.7168·T − 902.55
 * (from memory; the formula reproduces the table's tolerances within ~5 K).
 *
 * @example cctBandKelvin(3000) //=> { minKelvin: 2870, maxKelvin: 3220 }
 */
export function cctBandKelvin(preferredKelvin: number): { minKelvin: number; maxKelvin: number } {
  checkRange('preferredCctKelvin', preferredKelvin, 1000, 20_000);
  const bin = ansiNominalCct.find((b) => b.nominalKelvin === preferredKelvin);
  if (bin) return { minKelvin: bin.targetKelvin - bin.toleranceKelvin, maxKelvin: bin.targetKelvin + bin.toleranceKelvin };
  const t = Math.round(preferredKelvin / 100) * 100;
  const tolerance = 1.19e-8 * t ** 3 - 1.5434e-4 * t ** 2 + 0.7168 * t - 902.55;
  return { minKelvin: t - tolerance, maxKelvin: t + tolerance };
}

export { proposalFromProduct };

// ---------------------------------------------------------------------------
// Reasons: bits for the hot loop, messages on demand

const reasonOrder: readonly ChoiceReason[] = [
  'retired',
  'not-calculable',
  'form-mismatch',
  'not-dimmable',
  'dimmer-kind',
  'not-enclosed-rated',
  'moisture-rating',
  'not-emergency-listed',
  'not-ic-rated',
  'tube-needs-ballast',
  'tube-on-magnetic-ballast',
  'tube-type-unknown',
  'voltage-mismatch',
  'cri-too-low',
  'cct-mismatch',
  'too-little-light',
  'too-much-light',
  'room-under-target',
  'room-over-target',
];
const bit = Object.fromEntries(reasonOrder.map((code, i) => [code, 1 << i])) as Record<ChoiceReason, number>;

/**
 * Too much light turns a product down only while some product in the catalog
 * suits the fixture without it: when every otherwise suitable product
 * over-lights, they are judged on cost with a note instead, so the fixture
 * still gets a proposal (common practice, no published source: an over-lit
 * space is corrected with fewer fixtures or dimming, not left unconverted).
 */
const overLightBits = bit['too-much-light'] | bit['room-over-target'];

const forms: readonly ProductForm[] = ['screw-lamp', 'pin-lamp', 'linear-tube', 'luminaire', 'retrofit-kit'];
const formLabel: Readonly<Record<ProductForm, string>> = {
  'screw-lamp': 'a screw-in lamp',
  'pin-lamp': 'a pin-base lamp',
  'linear-tube': 'a linear tube',
  luminaire: 'a luminaire',
  'retrofit-kit': 'a retrofit kit',
};
const fixtureLabel: Readonly<Record<ExistingTechnology, string>> = {
  incandescent: 'a screw-base incandescent socket',
  halogen: 'a screw-base halogen socket',
  'cfl-screw': 'a screw-base CFL socket',
  'cfl-pin': 'a pin-base CFL socket',
  'linear-t12': 'a linear fluorescent fixture',
  'linear-t8': 'a linear fluorescent fixture',
  'linear-t5': 'a linear fluorescent fixture',
  'metal-halide': 'an HID fixture',
  'high-pressure-sodium': 'an HID fixture',
  'mercury-vapour': 'an HID fixture',
  led: 'existing LED equipment (only a new luminaire or kit is proposed)',
  other: 'equipment of an unrecorded kind (only a new luminaire or kit is proposed)',
};
const distributions: readonly Distribution[] = ['direct-narrow', 'direct-wide', 'semi-direct', 'diffuse', 'indirect'];

/** Tube kinds in the hot loop. */
const Tube = { None: 0, A: 1, B: 2, C: 3, AB: 4 } as const;
type Tube = (typeof Tube)[keyof typeof Tube];
const tubeCode: Readonly<Record<TubeType, Tube>> = { 'not-a-tube': Tube.None, 'type-a': Tube.A, 'type-b': Tube.B, 'type-c': Tube.C, 'type-a-b': Tube.AB };

/** Conditions that need every rating (used to read which ratings a product has). */
const demanding: FixtureConditions = {
  enclosed: true,
  dimmer: 'unknown',
  location: 'dry',
  emergencyCircuit: true,
  insulationContact: true,
  circuitVolts: 120,
};

/** Per-product constants, computed once per call. */
interface ProductFacts {
  product: CatalogProduct;
  /** Net first cost of one fixture's products and labour (markup, tax, rebate), before disposal. */
  netWithoutDisposal: number;
  /** Why the product cannot be calculated (bad field), or null. */
  invalid: string | null;
  retired: boolean;
  formBit: number;
  /** Ratings it has, read through the shared rules. */
  dimmable: boolean;
  /** Has a driver that can follow a 0-10 V control. */
  zeroTenCapable: boolean;
  enclosedRated: boolean;
  emergencyListed: boolean;
  icOk: boolean;
  moisture: number;
  cri: number;
  cct: number;
  voltsMin: number;
  voltsMax: number;
  voltsKnown: boolean;
  tube: Tube;
  isTube: boolean;
  /** Lamps and tubes lose the housing's share of light; luminaires and kits are rated at the fixture. */
  inHousing: boolean;
  /** Removes an existing ballast (same rule as the survey calculation's disposal cost). */
  removesBallast: boolean;
  deliveredLumens: number;
  wattsPerFixture: number;
  units: number;
  unitCost: number;
  installMinutes: number;
  rebate: number;
  lifeHours: number;
  distributionIndex: number;
}

/** Shared light figures of one room. */
interface RoomLight {
  floorSquareMetres: number;
  targetLux: number;
  /** CU for lumens leaving the fixture, per {@link distributions} index. */
  cuByDistribution: number[];
  /** Light loss factor for a new LED product (ballast factor 1). */
  llfNew: number;
}

/** Per-entry needs and constants, computed once per call. */
interface EntryNeeds {
  entry: FixtureEntry;
  room: Room;
  technology: ExistingTechnology;
  count: number;
  formMask: number;
  needsDimmable: boolean;
  zeroTen: boolean;
  phaseOrUnknownDimmer: boolean;
  needsEnclosed: boolean;
  needsEmergency: boolean;
  needsIc: boolean;
  insulationContact: boolean;
  location: number;
  minCri: number;
  cctMin: number;
  cctMax: number;
  hasCct: boolean;
  volts: number;
  ballast: FixtureEntry['existing']['ballast'];
  hid: boolean;
  /** Initial lumens leaving one existing fixture; NaN when unknown or 0. */
  existingLumens: number;
  housingEfficiency: number;
  light: RoomLight;
  /** Utilised lumens (Φ·CU·LLF) of the room's other fixtures as proposed; NaN when some are unknown. */
  othersUtilised: number;
  hoursProposed: number;
  /** Net cost (markup, tax) of disposal per fixture: lamps only, or lamps and ballast. */
  disposalNetKeepBallast: number;
  disposalNetRemoveBallast: number;
}

/** Survey-wide constants. */
interface Shared {
  survey: Survey;
  band: LumenBand;
  lightRule: LightRule;
  labourRate: number;
  money: Survey['money'];
  /** Money per watt of fixture load per year: energy (× hours) and demand. */
  energyPerWattHour: number;
  demandPerWatt: number;
  escalatedFactor: number;
  uniformFactor: number;
  relampMinutes: number;
}

function productFacts(product: CatalogProduct, money: Survey['money']): ProductFacts {
  let invalid: string | null = null;
  try {
    checkInteger('unitsPerFixture', product.unitsPerFixture, 1, 24);
    checkRange('wattsPerUnit', product.wattsPerUnit, 0.01, 100_000);
    checkRange('lumensPerUnit', product.lumensPerUnit, 0, 1e7);
    checkRange('unitCost', product.unitCost, 0, 1e7);
    checkRange('installMinutesPerFixture', product.installMinutesPerFixture, 0, 6000);
    checkRange('rebatePerFixture', product.rebatePerFixture, 0, 1e7);
    checkRange('ratedLifeHours', product.ratedLifeHours, 1, 1e6);
    checkRange('cri', product.cri, 0, 100);
    checkRange('cctKelvin', product.cctKelvin, 1000, 20_000);
    if (!distributions.includes(product.distribution)) throw new CalcInputError('distribution', `"${String(product.distribution)}" is not a known distribution class`);
    if (!forms.includes(product.form)) throw new CalcInputError('form', `"${String(product.form)}" is not a known product form`);
    if (product.inputVoltsMin !== undefined) checkRange('inputVoltsMin', product.inputVoltsMin, 1, 1000);
    if (product.inputVoltsMax !== undefined) checkRange('inputVoltsMax', product.inputVoltsMax, 1, 1000);
  } catch (err) {
    if (!(err instanceof CalcInputError)) throw err;
    invalid = `${err.field} ${err.problem}`;
  }
  const tube = tubeCode[product.tubeType] ?? Tube.None;
  const isTube = product.form === 'linear-tube';
  // projectCost is linear in its parts, so the product's share (disposal 0) is priced once here and the entry's disposal once per entry.
  const netWithoutDisposal =
    invalid === null
      ? projectCost(
          { materials: product.unitsPerFixture * product.unitCost, labour: (product.installMinutesPerFixture / 60) * money.labourRatePerHour, disposal: 0, rebates: product.rebatePerFixture },
          money,
        ).net
      : 0;
  return {
    product,
    invalid,
    netWithoutDisposal,
    retired: product.retired,
    formBit: 1 << Math.max(0, forms.indexOf(product.form)),
    dimmable: !ratingRules.dimmer(demanding, product),
    // Common practice, no published source: 0-10 V control wires land on a
    // driver, so a luminaire, a kit or a Type C tube's remote driver can take
    // them; a screw-in or pin lamp, or a tube on the ballast or on line voltage, cannot.
    zeroTenCapable: product.form === 'luminaire' || product.form === 'retrofit-kit' || (isTube && tube === Tube.C),
    enclosedRated: !ratingRules.enclosed(demanding, product),
    emergencyListed: !ratingRules.emergency(demanding, product),
    icOk: !ratingRules.insulationLuminaire(demanding, product),
    moisture: moistureRank[product.moistureRating],
    cri: product.cri,
    cct: product.cctKelvin,
    voltsMin: product.inputVoltsMin ?? 0,
    voltsMax: product.inputVoltsMax ?? Number.POSITIVE_INFINITY,
    voltsKnown: product.inputVoltsMin !== undefined || product.inputVoltsMax !== undefined,
    tube,
    isTube,
    inHousing: product.form !== 'luminaire' && product.form !== 'retrofit-kit',
    // Same rule as `removesBallast` in survey.ts (the LCC test against calculateSurvey guards it).
    removesBallast: product.form === 'luminaire' || product.form === 'retrofit-kit' || tube === Tube.B || tube === Tube.C || tube === Tube.AB,
    deliveredLumens: product.unitsPerFixture * product.lumensPerUnit,
    wattsPerFixture: product.unitsPerFixture * product.wattsPerUnit,
    units: product.unitsPerFixture,
    unitCost: product.unitCost,
    installMinutes: product.installMinutesPerFixture,
    rebate: product.rebatePerFixture,
    lifeHours: product.ratedLifeHours,
    distributionIndex: Math.max(0, distributions.indexOf(product.distribution)),
  };
}

/** A typed-in proposal judged like a catalog product. */
function proposalAsProduct(p: ProposedProduct): CatalogProduct {
  const { catalogId, ...spec } = p;
  return { ...spec, id: catalogId ?? '', example: false, retired: false, sku: '' };
}

/** Prefixes a calculation input error with the record it came from, as calculateSurvey does. */
function within<T>(prefix: string, run: () => T): T {
  try {
    return run();
  } catch (err) {
    throw err instanceof CalcInputError ? new CalcInputError(`${prefix}.${err.field}`, err.problem) : err;
  }
}

/** The lumen-method figures of a room, as the survey calculation computes them. */
function roomLight(room: Room): RoomLight & { rcr: number } {
  if (typeof room.spaceType !== 'string' || !Object.hasOwn(spaceFacts, room.spaceType)) {
    throw new CalcInputError('spaceType', `"${String(room.spaceType)}" is not a known space type`);
  }
  const floor = floorOf(room);
  const ceiling = checkRange('ceilingHeightMetres', room.ceilingHeightMetres, 0.1, 100);
  const workPlane = checkRange('workPlaneHeightMetres', room.workPlaneHeightMetres, 0, 100);
  const rcr = roomCavityRatio(floor.lengthMetres, floor.widthMetres, Math.max(ceiling - workPlane, 0.01));
  const ph = room.photometry;
  if (ph.coefficientOfUtilisation !== undefined) checkRange('photometry.coefficientOfUtilisation', ph.coefficientOfUtilisation, 0.01, 1.5);
  if (ph.lightLossFactor !== undefined) checkRange('photometry.lightLossFactor', ph.lightLossFactor, 0.01, 1.5);
  const ldd = ph.luminaireDirtDepreciation ?? defaultDirtDepreciation.luminaire;
  const rsdd = ph.roomSurfaceDirtDepreciation ?? defaultDirtDepreciation.roomSurface;
  const cuOverride = ph.coefficientOfUtilisation;
  return {
    rcr,
    floorSquareMetres: floor.squareMetres,
    targetLux: targetLux(room.spaceType),
    cuByDistribution: distributions.map((d) => cuOverride ?? coefficientOfUtilisationForLuminaireLumens(d, rcr)),
    // As the survey calculation's lumen method: a new product has ballast factor 1.
    llfNew: ph.lightLossFactor !== undefined ? ph.lightLossFactor : lampLumenDepreciationDefault('led') * ldd * rsdd,
  };
}

/** Utilised lumens (Φ·CU·LLF) of one entry as proposed now, as the survey calculation's lumen method counts it; NaN when unknown. */
function utilisedNow(room: Room, entry: FixtureEntry, light: RoomLight & { rcr: number }, count: number, existingLumens: number | null, housingEfficiency: number): number {
  if (count === 0) return 0;
  const ph = room.photometry;
  const p = entry.proposed;
  if (p) {
    const units = checkInteger('proposed.unitsPerFixture', p.unitsPerFixture, 1, 24);
    const lumens = units * checkRange('proposed.lumensPerUnit', p.lumensPerUnit, 0, 1e7) * (p.form === 'luminaire' || p.form === 'retrofit-kit' ? 1 : housingEfficiency);
    return count * lumens * light.cuByDistribution[Math.max(0, distributions.indexOf(p.distribution))]! * light.llfNew;
  }
  if (existingLumens === null) return Number.NaN;
  const e = entry.existing;
  const cu = ph.coefficientOfUtilisation ?? coefficientOfUtilisationForLuminaireLumens(typicalExistingDistribution[e.technology], light.rcr);
  let llf: number;
  if (ph.lightLossFactor !== undefined) {
    llf = ph.lightLossFactor / (e.ballastFactor ?? ballastFactorDefault(e.ballast));
  } else {
    const ldd = ph.luminaireDirtDepreciation ?? defaultDirtDepreciation.luminaire;
    const rsdd = ph.roomSurfaceDirtDepreciation ?? defaultDirtDepreciation.roomSurface;
    llf = lampLumenDepreciationDefault(e.technology) * ldd * rsdd;
  }
  return count * existingLumens * cu * llf;
}

interface Prepared {
  shared: Shared;
  products: ProductFacts[];
  entries: EntryNeeds[];
}

function prepare(survey: Survey, catalog: readonly CatalogProduct[], options: ChoiceOptions, only: ReadonlySet<string> | null, roomOffset = 0): Prepared {
  const m = survey.money;
  checkMoney(survey);
  const escalation = checkRange('money.energyEscalationPerYear', m.energyEscalationPerYear, -0.5, 0.5);
  const discount = checkRange('money.discountRatePerYear', m.discountRatePerYear, 0, 0.5);
  const years = checkInteger('money.analysisYears', m.analysisYears, 1, 40);
  const band = options.lumenBand ?? defaultLumenBand;
  checkRange('lumenBand.minRatio', band.minRatio, 0, 100);
  checkRange('lumenBand.maxRatio', band.maxRatio, band.minRatio, 100);
  const f = surveyFactors(survey);
  const shared: Shared = {
    survey,
    band,
    lightRule: options.lightRule ?? 'fixture-first',
    labourRate: m.labourRatePerHour,
    money: m,
    // The survey calculation's energy money: kWh × (1 + HVAC_c) × rate; demand: kW × CF × (1 + HVAC_d) × charge × 12.
    energyPerWattHour: (f.hvacEnergyFactor * m.energyRatePerKwh) / 1000,
    demandPerWatt: (f.coincidenceFactor * f.hvacDemandFactor * m.demandChargePerKwMonth * 12) / 1000,
    // Year t pays A1·(1 + e)^(t−1) at its end, as analyseInvestment discounts savings.
    escalatedFactor: escalatedUniformPresentValueFactor(discount, escalation, years) / (1 + escalation),
    uniformFactor: uniformPresentValueFactor(discount, years),
    relampMinutes: m.relampMinutes,
  };
  const disposalNet = (amount: number) => (amount === 0 ? 0 : projectCost({ materials: 0, labour: 0, disposal: amount, rebates: 0 }, m).net);
  const products = catalog.map((product) => productFacts(product, m));
  const entries: EntryNeeds[] = [];
  survey.rooms.forEach((room, ri) => {
    if (only && !room.entries.some((e) => only.has(e.id))) return;
    within(`rooms[${ri + roomOffset}]`, () => {
      const light = roomLight(room);
      const hours = annualHours(room.hours);
      const occupancy = spaceFacts[room.spaceType].occupancySensorSavingsFraction;
      const minCri = minimumCri(room.colourCritical);
      const cct = room.preferredCctKelvin !== undefined ? cctBandKelvin(room.preferredCctKelvin) : null;
      const facts = room.entries.map((entry, ei) =>
        within(`entries[${ei}]`, () => {
          const count = checkInteger('count', entry.count, 0, 100_000);
          checkInteger('existing.lampsPerFixture', entry.existing.lampsPerFixture, 1, 24);
          const housingEfficiency = housingEfficiencyOf(entry);
          const existingLumens = existingLumensPerFixture(entry);
          return { count, housingEfficiency, existingLumens, utilised: utilisedNow(room, entry, light, count, existingLumens, housingEfficiency) };
        }),
      );
      let knownSum = 0;
      let unknown = 0;
      for (const x of facts) {
        if (Number.isNaN(x.utilised)) unknown++;
        else knownSum += x.utilised;
      }
      room.entries.forEach((entry, ei) => {
        if (only && !only.has(entry.id)) return;
        within(`entries[${ei}]`, () => {
          const x = facts[ei]!;
          const c = entry.conditions;
          const e = entry.existing;
          const volts = checkRange('conditions.circuitVolts', c.circuitVolts, 1, 1000);
          const controlFraction = controlSavingsFraction(entry.control, occupancy, entry.controlSavingsFraction);
          const selfUnknown = Number.isNaN(x.utilised);
          const othersUtilised = unknown - (selfUnknown ? 1 : 0) > 0 ? Number.NaN : knownSum - (selfUnknown ? 0 : x.utilised);
          let formMask = 0;
          for (const form of formsFitting[e.technology] ?? []) formMask |= 1 << forms.indexOf(form);
          const mercury = hasMercury(e.technology) ? e.lampsPerFixture * m.lampRecyclingCostEach : 0;
          entries.push({
            entry,
            room,
            technology: e.technology,
            count: x.count,
            formMask,
            needsDimmable: ratingRules.dimmer(c, { dimmable: false }),
            zeroTen: c.dimmer === '0-10v',
            phaseOrUnknownDimmer: c.dimmer === 'leading-edge' || c.dimmer === 'unknown',
            needsEnclosed: ratingRules.enclosed(c, { enclosedRated: false }),
            needsEmergency: ratingRules.emergency(c, { emergencyListed: false }),
            needsIc: ratingRules.insulationLuminaire(c, { form: 'luminaire', insulationContactRated: false }),
            insulationContact: c.insulationContact,
            location: moistureRank[c.location],
            minCri,
            cctMin: cct ? cct.minKelvin : 0,
            cctMax: cct ? cct.maxKelvin : Number.POSITIVE_INFINITY,
            hasCct: cct !== null,
            volts,
            ballast: e.ballast,
            hid: hidTechnologies.has(e.technology),
            existingLumens: x.existingLumens !== null && x.existingLumens > 0 ? x.existingLumens : Number.NaN,
            housingEfficiency: x.housingEfficiency,
            light,
            othersUtilised,
            hoursProposed: hours * (1 - controlFraction),
            disposalNetKeepBallast: disposalNet(mercury),
            disposalNetRemoveBallast: disposalNet(mercury + (e.ballast !== 'none' ? m.ballastDisposalCostEach : 0)),
          });
        });
      });
    });
  });
  return { shared, products, entries };
}

function lumensOf(n: EntryNeeds, p: ProductFacts): number {
  return p.inHousing ? p.deliveredLumens * n.housingEfficiency : p.deliveredLumens;
}

/** Room maintained illuminance with this product in the entry (lux); NaN when unknown. */
function roomLuxWith(n: EntryNeeds, p: ProductFacts): number {
  const own = n.count * lumensOf(n, p) * n.light.cuByDistribution[p.distributionIndex]! * n.light.llfNew;
  return (n.othersUtilised + own) / n.light.floorSquareMetres;
}

/** Bit set of the reasons `p` does not suit `n` (0 when it fits). The hot path: no allocation. */
function rejectMask(s: Shared, n: EntryNeeds, p: ProductFacts): number {
  if (p.retired) return bit.retired;
  if (p.invalid !== null) return bit['not-calculable'];
  let mask = 0;
  if ((n.formMask & p.formBit) === 0) mask |= bit['form-mismatch'];
  if (n.needsDimmable && !p.dimmable) mask |= bit['not-dimmable'];
  else if (n.zeroTen && !p.zeroTenCapable) mask |= bit['dimmer-kind'];
  if (n.needsEnclosed && !p.enclosedRated) mask |= bit['not-enclosed-rated'];
  if (p.moisture < n.location) mask |= bit['moisture-rating'];
  if (n.needsEmergency && !p.emergencyListed) mask |= bit['not-emergency-listed'];
  if (n.needsIc && !p.icOk) mask |= bit['not-ic-rated'];
  if (p.isTube) {
    if (p.tube === Tube.None) mask |= bit['tube-type-unknown'];
    else if (p.tube === Tube.A) {
      if (n.ballast === 'none') mask |= bit['tube-needs-ballast'];
      else if (n.ballast === 'magnetic') mask |= bit['tube-on-magnetic-ballast'];
    }
  }
  if (n.volts < p.voltsMin || n.volts > p.voltsMax) mask |= bit['voltage-mismatch'];
  if (p.cri < n.minCri) mask |= bit['cri-too-low'];
  if (n.hasCct && (p.cct < n.cctMin || p.cct > n.cctMax)) mask |= bit['cct-mismatch'];
  mask |= lightMask(s, n, p);
  return mask;
}

/** Which light figure decides: 'fixture', 'room' or null (neither known). */
function lightBasis(s: Shared, n: EntryNeeds): 'fixture' | 'room' | null {
  const fixtureKnown = !Number.isNaN(n.existingLumens);
  const roomKnown = !Number.isNaN(n.othersUtilised) && n.light.targetLux > 0;
  if (s.lightRule === 'room-first') return roomKnown ? 'room' : fixtureKnown ? 'fixture' : null;
  return fixtureKnown ? 'fixture' : roomKnown ? 'room' : null;
}

function lightMask(s: Shared, n: EntryNeeds, p: ProductFacts): number {
  const basis = lightBasis(s, n);
  if (basis === 'fixture') {
    const ratio = lumensOf(n, p) / n.existingLumens;
    if (ratio < s.band.minRatio) return bit['too-little-light'];
    if (ratio > s.band.maxRatio) return bit['too-much-light'];
  } else if (basis === 'room') {
    const ratio = roomLuxWith(n, p) / n.light.targetLux;
    if (ratio < warningThresholds.illuminanceShortFraction) return bit['room-under-target'];
    if (ratio > warningThresholds.illuminanceOverFraction) return bit['room-over-target'];
  }
  return 0;
}

/** Life-cycle cost of one fixture with product `p` (see the file header). */
function lccPerFixture(s: Shared, n: EntryNeeds, p: ProductFacts): number {
  const net = p.netWithoutDisposal + (p.removesBallast ? n.disposalNetRemoveBallast : n.disposalNetKeepBallast);
  const yearly = p.wattsPerFixture * (n.hoursProposed * s.energyPerWattHour + s.demandPerWatt);
  const relamp = relampCostPerYear(p.units, n.hoursProposed, p.lifeHours, p.unitCost, s.relampMinutes, s.labourRate);
  return net + yearly * s.escalatedFactor + relamp * s.uniformFactor;
}

/** True when candidate a ranks before b: lower LCC, then more lumens, then lower id. */
function ranksBefore(aLcc: number, aLumens: number, aId: string, bLcc: number, bLumens: number, bId: string): boolean {
  if (aLcc !== bLcc) return aLcc < bLcc;
  if (aLumens !== bLumens) return aLumens > bLumens;
  return aId < bId;
}

// ---------------------------------------------------------------------------
// Messages

function pct(fraction: number): string {
  return `${Math.round(fraction * 100)} %`;
}

function reasonMessage(s: Shared, code: ChoiceReason, n: EntryNeeds, p: ProductFacts): string {
  const c = n.entry.conditions;
  const product = p.product;
  const light = (lux: number) => `${Math.round(toDisplay('illuminance', lux, s.survey.units))} ${displayUnits.illuminance[s.survey.units]}`;
  switch (code) {
    case 'retired':
      return 'retired from the catalog';
    case 'not-calculable':
      return `cannot be calculated: ${p.invalid ?? 'a figure is out of range'}`;
    case 'form-mismatch':
      return `${formLabel[product.form] ?? 'this product'} does not fit ${fixtureLabel[n.technology]}`;
    case 'not-dimmable':
      return c.dimmer === '0-10v' ? 'not dimmable by the 0-10 V control' : 'not dimmable, and this circuit has a dimmer';
    case 'dimmer-kind':
      return 'cannot take the 0-10 V control wires (needs a luminaire, a kit or a Type C tube driver)';
    case 'not-enclosed-rated':
      return 'not rated for enclosed fixtures';
    case 'moisture-rating':
      return `rated for ${product.moistureRating} locations only; this one is ${c.location}`;
    case 'not-emergency-listed':
      return 'not listed for emergency circuits';
    case 'not-ic-rated':
      return 'not IC-rated, and the fixture touches insulation';
    case 'tube-needs-ballast':
      return 'a Type A tube runs on a ballast, and this fixture has none';
    case 'tube-on-magnetic-ballast':
      return 'a Type A tube is seldom supported on the magnetic ballast here';
    case 'tube-type-unknown':
      return 'the tube type (A, B or C) is not recorded';
    case 'voltage-mismatch':
      return `rated ${product.inputVoltsMin ?? '?'}–${product.inputVoltsMax ?? '?'} V; this circuit is ${n.volts} V`;
    case 'cri-too-low':
      return `CRI ${product.cri} is below the ${n.minCri} this space needs${n.room.colourCritical ? ' (colour matters here)' : ''}`;
    case 'cct-mismatch':
      return `${product.cctKelvin} K is outside the ${Math.round(n.cctMin)}–${Math.round(n.cctMax)} K band of the ${n.room.preferredCctKelvin} K wanted here`;
    case 'too-little-light':
      return `too little light: ${pct(lumensOf(n, p) / n.existingLumens)} of today’s`;
    case 'too-much-light':
      return `far more light than today: ${pct(lumensOf(n, p) / n.existingLumens)}`;
    case 'room-under-target':
    case 'room-over-target': {
      const lux = roomLuxWith(n, p);
      return `the room would get ${light(lux)} against a target of ${light(n.light.targetLux)} (${pct(lux / n.light.targetLux)})`;
    }
  }
}

function reasonsOf(s: Shared, mask: number, n: EntryNeeds, p: ProductFacts): ChoiceReasonItem[] {
  const out: ChoiceReasonItem[] = [];
  for (let i = 0; i < reasonOrder.length; i++) {
    if (mask & (1 << i)) {
      const code = reasonOrder[i]!;
      out.push({ code, message: reasonMessage(s, code, n, p) });
    }
  }
  return out;
}

function note(code: ChoiceNote, message: string, safety = false): ChoiceNoteItem {
  return { code, message: safety ? `${message} ${safetyDeferral}` : message, safety };
}

function notesOf(s: Shared, n: EntryNeeds, p: ProductFacts): ChoiceNoteItem[] {
  const out: ChoiceNoteItem[] = [];
  if (p.invalid !== null) return out;
  const product = p.product;
  const light = (lux: number) => `${Math.round(toDisplay('illuminance', lux, s.survey.units))} ${displayUnits.illuminance[s.survey.units]}`;
  // A Type A tube runs on the fixture's ballast, so the circuit voltage is the ballast's concern.
  if (!p.voltsKnown && !(p.isTube && p.tube === Tube.A)) out.push(note('voltage-unknown', `Input voltage range not recorded: check it runs on ${n.volts} V.`));
  const basis = lightBasis(s, n);
  if (basis === null) out.push(note('light-unknown', "Today's light output is unknown here, so the light was not checked."));
  else if (basis === 'room') {
    const lux = roomLuxWith(n, p);
    out.push(note('light-by-room', `Light judged for the room: ${light(lux)} against a target of ${light(n.light.targetLux)} (${pct(lux / n.light.targetLux)}).`));
  }
  if (p.isTube && (p.tube === Tube.B || p.tube === Tube.AB)) {
    out.push(note('ballast-bypass', 'Ballast bypass: line voltage goes to the lampholders (non-shunted holders where the wiring needs them) and the converted fixture must be labelled.', true));
  } else if ((p.isTube && p.tube === Tube.C) || (product.form === 'retrofit-kit' && n.ballast !== 'none')) {
    out.push(note('fixture-rewired', p.isTube ? 'The ballast comes out and the fixture is rewired to a remote driver; its price should include the driver.' : 'Fitting the kit removes the ballast and rewires the fixture; apply the conversion label.', true));
  } else if (p.isTube && p.tube === Tube.A) {
    out.push(note('ballast-compatibility', "The tube runs on the existing ballast: check the ballast is on the tube maker's compatibility list."));
  }
  if (n.hid && product.form === 'screw-lamp') {
    // Common practice, no published source: most LED replacements for HID lamps are wired with the ballast and ignitor bypassed.
    out.push(note('hid-lamp-wiring', "An LED lamp in an HID fixture usually needs the ballast and ignitor bypassed; follow the lamp's instructions and label the fixture.", true));
  }
  if (product.dimmable && n.phaseOrUnknownDimmer) {
    out.push(note('dimmer-compatibility', "Check the dimmer against the product maker's compatibility list and its minimum load."));
  }
  if (n.insulationContact && product.form !== 'luminaire') {
    out.push(note('insulation-contact', 'The existing housing touches insulation: keep insulation clear as its listing requires.', true));
  }
  if (n.entry.conditions.emergencyCircuit && product.emergencyListed) {
    out.push(note('emergency-circuit', 'Emergency circuit: test the emergency function (duration and light level) after installation.', true));
  }
  return out;
}

function outcome(s: Shared, n: EntryNeeds, p: ProductFacts, mask: number, proposal: ProposedProduct | null, relaxed = false): CandidateOutcome {
  const perFixture = p.invalid === null ? lccPerFixture(s, n, p) : null;
  const notes = notesOf(s, n, p);
  if (relaxed && mask === 0 && (rejectMask(s, n, p) & overLightBits) !== 0) {
    const over = reasonsOf(s, rejectMask(s, n, p) & overLightBits, n, p)[0];
    notes.push(note('more-light-than-needed', `More light than needed (${over?.message ?? 'over the target'}), but no product in the catalog suits this fixture with less: consider fewer fixtures, a dimmer or a lower-output product.`));
  }
  return {
    productId: proposal ? (proposal.catalogId ?? null) : p.product.id,
    name: p.product.name,
    accepted: mask === 0,
    lifeCycleCost: perFixture === null ? null : perFixture * n.count,
    lifeCycleCostPerFixture: perFixture,
    lumensPerFixture: p.invalid === null ? lumensOf(n, p) : 0,
    reasons: reasonsOf(s, mask, n, p),
    notes,
    proposal: proposal ?? proposalFromProduct(p.product),
  };
}

/** The reasons that count for this entry: without the over-light ones when `relaxed` (see {@link overLightBits}). */
function entryMask(s: Shared, n: EntryNeeds, p: ProductFacts, relaxed: boolean): number {
  const mask = rejectMask(s, n, p);
  return relaxed ? mask & ~overLightBits : mask;
}

function allCandidates(s: Shared, n: EntryNeeds, products: readonly ProductFacts[], relaxed: boolean): CandidateOutcome[] {
  const list = products.map((p) => outcome(s, n, p, entryMask(s, n, p, relaxed), null, relaxed));
  const rank = (o: CandidateOutcome) => (o.accepted ? 0 : 1);
  return list.sort((a, b) => {
    if (rank(a) !== rank(b)) return rank(a) - rank(b);
    if (a.accepted) {
      return ranksBefore(a.lifeCycleCostPerFixture!, a.lumensPerFixture, a.productId ?? '', b.lifeCycleCostPerFixture!, b.lumensPerFixture, b.productId ?? '') ? -1 : 1;
    }
    const ia = a.productId ?? '';
    const ib = b.productId ?? '';
    return ia < ib ? -1 : ia > ib ? 1 : 0;
  });
}

/** Index of the best product for the entry (lowest LCC among those passing the mask), or -1. */
function bestOf(s: Shared, n: EntryNeeds, products: readonly ProductFacts[], relaxed: boolean): number {
  let bestIndex = -1;
  let bestLcc = 0;
  let bestLumens = 0;
  let bestId = '';
  for (let i = 0; i < products.length; i++) {
    const p = products[i]!;
    if (entryMask(s, n, p, relaxed) !== 0) continue;
    const lcc = lccPerFixture(s, n, p);
    const lumens = lumensOf(n, p);
    if (bestIndex < 0 || ranksBefore(lcc, lumens, p.product.id, bestLcc, bestLumens, bestId)) {
      bestIndex = i;
      bestLcc = lcc;
      bestLumens = lumens;
      bestId = p.product.id;
    }
  }
  return bestIndex;
}

function chooseFor(s: Shared, n: EntryNeeds, products: readonly ProductFacts[], eager: boolean): EntryChoice {
  let relaxed = false;
  let bestIndex = bestOf(s, n, products, false);
  if (bestIndex < 0) {
    bestIndex = bestOf(s, n, products, true);
    relaxed = bestIndex >= 0;
  }
  const best = bestIndex >= 0 ? outcome(s, n, products[bestIndex]!, 0, null, relaxed) : null;
  const proposed = n.entry.proposed;
  const judgeCurrent = (): CandidateOutcome | null => {
    if (!proposed) return null;
    const facts = productFacts(proposalAsProduct(proposed), s.money);
    return outcome(s, n, facts, entryMask(s, n, facts, relaxed), proposed, relaxed);
  };
  const choice = {
    entryId: n.entry.id,
    roomId: n.room.id,
    roomName: n.room.name,
    description: n.entry.existing.description,
    count: n.count,
    best,
    changed: best !== null && (proposed === null || proposed.catalogId !== best.productId),
  } as Omit<EntryChoice, 'candidates' | 'current'> as EntryChoice;
  if (eager) {
    choice.current = judgeCurrent();
    choice.candidates = allCandidates(s, n, products, relaxed);
  } else {
    // Built on first read: 10,000 entries × 200 products would be two million outcomes.
    let current: CandidateOutcome | null | undefined;
    let list: CandidateOutcome[] | null = null;
    Object.defineProperty(choice, 'current', { enumerable: true, get: () => (current === undefined ? (current = judgeCurrent()) : current) });
    Object.defineProperty(choice, 'candidates', { enumerable: true, get: () => (list ??= allCandidates(s, n, products, relaxed)) });
  }
  return choice;
}

function counted(prepared: Prepared, entries: EntryChoice[]): ChoiceCounts {
  let withChoice = 0;
  let changed = 0;
  for (const e of entries) {
    if (e.best) withChoice++;
    if (e.changed) changed++;
  }
  return {
    entries: entries.length,
    withChoice,
    changed,
    noFit: entries.length - withChoice,
    products: prepared.products.length,
    retiredProducts: prepared.products.filter((p) => p.retired).length,
  };
}

function checkEntryIds(survey: Survey, ids: readonly string[]): Set<string> {
  const known = new Set<string>();
  for (const room of survey.rooms) for (const e of room.entries) known.add(e.id);
  for (const id of ids) if (!known.has(id)) throw new CalcInputError('entryIds', `entry "${id}" is not in the survey`);
  return new Set(ids);
}

/**
 * For every entry (or `options.entryIds`), the catalog product with the
 * lowest life-cycle cost that meets every constraint, the entry's current
 * proposal judged the same way, and (on first read of `candidates`) every
 * product with its reasons. Pure: the survey is not changed. Throws a
 * `CalcInputError` naming the field (as `calculateSurvey` does) when the
 * survey cannot be calculated.
 *
 * @example chooseProducts(demoSurvey(), exampleCatalog).entries[0].best?.productId //=> 'example-troffer-kit'
 */
export function chooseProducts(survey: Survey, catalog: readonly CatalogProduct[], options: ChoiceOptions = {}): SurveyChoice {
  const only = options.entryIds ? checkEntryIds(survey, options.entryIds) : null;
  const prepared = prepare(survey, catalog, options, only);
  const { shared, products } = prepared;
  const entries = prepared.entries.map((n) => chooseFor(shared, n, products, false));
  return {
    surveyId: survey.id,
    currency: survey.money.currency,
    analysisYears: survey.money.analysisYears,
    lightRule: shared.lightRule,
    entries,
    counts: counted(prepared, entries),
  };
}

/**
 * The full judgement of one entry: every catalog product with its LCC,
 * reasons and notes (accepted first by LCC), for a screen or a report. Only
 * the entry's room is calculated.
 *
 * @example explainEntry(survey, catalog, 'demo-office-troffers').candidates.filter(c => !c.accepted)[0].reasons[0].message //=> 'a screw-in lamp does not fit a linear fluorescent fixture'
 */
export function explainEntry(survey: Survey, catalog: readonly CatalogProduct[], entryId: string, options: Omit<ChoiceOptions, 'entryIds'> = {}): EntryChoice {
  const roomIndex = survey.rooms.findIndex((r) => r.entries.some((e) => e.id === entryId));
  if (roomIndex < 0) throw new CalcInputError('entryId', `entry "${entryId}" is not in the survey`);
  const oneRoom: Survey = { ...survey, rooms: [survey.rooms[roomIndex]!] };
  const prepared = prepare(oneRoom, catalog, options, new Set([entryId]), roomIndex);
  return chooseFor(prepared.shared, prepared.entries[0]!, prepared.products, true);
}

/**
 * The rating reasons alone (dimmer, enclosed, moisture, emergency, IC) for a
 * product in a fixture's conditions, with the same messages as the choice.
 *
 * @example ratingReasons(nonDimmableLamp, { dimmer: 'leading-edge', … }).map(r => r.message) //=> ['not dimmable, and this circuit has a dimmer']
 */
export function ratingReasons(product: RatedProduct, conditions: FixtureConditions): ChoiceReasonItem[] {
  const out: ChoiceReasonItem[] = [];
  if (ratingRules.dimmer(conditions, product)) {
    out.push({ code: 'not-dimmable', message: conditions.dimmer === '0-10v' ? 'not dimmable by the 0-10 V control' : 'not dimmable, and this circuit has a dimmer' });
  }
  if (ratingRules.enclosed(conditions, product)) out.push({ code: 'not-enclosed-rated', message: 'not rated for enclosed fixtures' });
  if (ratingRules.moisture(conditions, product)) {
    out.push({ code: 'moisture-rating', message: `rated for ${product.moistureRating} locations only; this one is ${conditions.location}` });
  }
  if (ratingRules.emergency(conditions, product)) out.push({ code: 'not-emergency-listed', message: 'not listed for emergency circuits' });
  if (ratingRules.insulationLuminaire(conditions, product)) out.push({ code: 'not-ic-rated', message: 'not IC-rated, and the fixture touches insulation' });
  return out;
}

/**
 * A new survey in which each listed entry's proposal becomes its best
 * product; every other entry, room and field is unchanged (unchanged rooms
 * are the same objects). Entries without a best product stay as they are.
 * Throws a `CalcInputError` when the choice was made for another survey or
 * an id is not in the choice.
 *
 * @example applyChoices(survey, chooseProducts(survey, catalog), ['demo-office-troffers']) //=> survey with that entry's proposal replaced
 */
export function applyChoices(survey: Survey, choice: SurveyChoice, entryIds: readonly string[]): Survey {
  if (choice.surveyId !== survey.id) {
    throw new CalcInputError('choice', `was made for survey "${choice.surveyId}", not "${survey.id}"`);
  }
  const byId = new Map(choice.entries.map((e) => [e.entryId, e]));
  const wanted = new Map<string, ProposedProduct>();
  for (const id of entryIds) {
    const e = byId.get(id);
    if (!e) throw new CalcInputError('entryIds', `entry "${id}" is not in the choice`);
    if (e.best) wanted.set(id, e.best.proposal);
  }
  if (wanted.size === 0) return { ...survey };
  const rooms = survey.rooms.map((room) => {
    if (!room.entries.some((e) => wanted.has(e.id))) return room;
    return { ...room, entries: room.entries.map((e) => (wanted.has(e.id) ? { ...e, proposed: { ...wanted.get(e.id)! } } : e)) };
  });
  return { ...survey, rooms };
}
