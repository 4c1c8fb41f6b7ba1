/**
 * What a new survey, room or fixture entry starts as. Every figure here is
 * either the user's own default (Settings), a published value the
 * calculation names the source of, or marked as Lampwalk's own choice.
 */
import { ukGridFactors } from '../../calc/emissions.ts';
import { buildingOperatingDefaults } from '../../calc/energy.ts';
import type { TypicalEquipment } from '../../calc/equipment.ts';
import type { ExistingEquipment, FixtureConditions, GridFactorChoice, HoursOfUse } from '../../survey/model.ts';
import type { NewEntry, NewRoom, NewSurvey } from '../../survey/store.ts';
import { region, type Preferences } from './preferences.ts';

/** Real discount rate: FEMP 2010 real discount rate 3.0 % (NIST Handbook 135 annual supplement). */
export const defaultDiscountRatePerYear = 0.03;
/** Study period, years — Lampwalk's own choice (common practice, no published source): well inside LED rated lives at typical hours. */
export const defaultAnalysisYears = 15;

/** The newest UK factor year built into the calculation. */
export const newestUkYear: number = Math.max(...Object.keys(ukGridFactors).map(Number));

/**
 * The grid factor a new survey uses: the user's choice, else the published one for the device's region.
 *
 * @example gridFor(defaultPreferences('en-GB')) //=> { kind: 'uk', year: 2024 }
 */
export function gridFor(preferences: Preferences): GridFactorChoice {
  if (preferences.grid) return preferences.grid;
  return region(preferences.locale) === 'GB' ? { kind: 'uk', year: newestUkYear } : { kind: 'egrid', subregion: 'US' };
}

/**
 * A new, empty survey from the user's defaults.
 *
 * @example newSurveyFields(defaultPreferences('en-US'), 'Hall').money.discountRatePerYear //=> 0.03
 */
export function newSurveyFields(preferences: Preferences, name: string): NewSurvey {
  return {
    name,
    site: { name: '', address: '' },
    client: { name: '', contact: '' },
    preparedBy: preferences.preparedBy,
    buildingType: preferences.buildingType,
    heatingType: preferences.heatingType,
    cooled: true,
    units: preferences.units,
    locale: preferences.locale,
    money: {
      currency: preferences.currency,
      energyRatePerKwh: preferences.energyRatePerKwh,
      demandChargePerKwMonth: preferences.demandChargePerKwMonth,
      // Real escalation 0: prices held level in real terms (Lampwalk's own choice, the cautious case).
      energyEscalationPerYear: 0,
      discountRatePerYear: defaultDiscountRatePerYear,
      analysisYears: defaultAnalysisYears,
      labourRatePerHour: preferences.labourRatePerHour,
      markupFraction: preferences.markupFraction,
      taxFraction: preferences.taxFraction,
      taxBase: 'materials',
      lampRecyclingCostEach: 0,
      ballastDisposalCostEach: 0,
      relampMinutes: 0,
    },
    savings: {},
    grid: gridFor(preferences),
    notes: '',
  };
}

/**
 * Hours a new room starts with: the building type's default (from memory, see `buildingOperatingDefaults`).
 *
 * @example defaultHours('office-small') //=> { kind: 'annual', hoursPerYear: 3000 }
 */
export function defaultHours(buildingType: NewSurvey['buildingType']): HoursOfUse {
  return { kind: 'annual', hoursPerYear: buildingOperatingDefaults[buildingType].hoursPerYear };
}

/** Work-plane height for desks, 0.76 m (30 in) — from memory: the usual lumen-method convention for offices. */
export const deskWorkPlaneMetres = 0.76;

/** What the "add a room" form asks for. */
export interface RoomBasics {
  name: string;
  spaceType: NewRoom['spaceType'];
  floor: NewRoom['floor'];
  ceilingHeightMetres: number;
}

/**
 * A new room from what the user measured; hours from the building type's default.
 *
 * @example newRoomFields('office-small', { name: 'Hall', spaceType: 'corridor', floor, ceilingHeightMetres: 2.7 }).workPlaneHeightMetres //=> 0.76
 */
export function newRoomFields(buildingType: NewSurvey['buildingType'], basics: RoomBasics): NewRoom {
  return {
    ...basics,
    workPlaneHeightMetres: Math.min(deskWorkPlaneMetres, basics.ceilingHeightMetres / 2),
    hours: defaultHours(buildingType),
    colourCritical: false,
    photometry: {},
    notes: '',
  };
}

/**
 * The space type a new room of this building most likely is.
 *
 * @example likelySpace('multifamily') //=> 'dwelling-unit'
 */
export function likelySpace(buildingType: NewSurvey['buildingType']): NewRoom['spaceType'] {
  switch (buildingType) {
    case 'multifamily':
      return 'dwelling-unit';
    case 'retail':
      return 'retail-sales';
    case 'school':
      return 'classroom';
    case 'warehouse':
      return 'warehouse-bulky';
    case 'restaurant':
      return 'dining';
    default:
      return 'office-open';
  }
}

/**
 * Ordinary dry-location conditions on a circuit of `volts`.
 *
 * @example plainConditions(230).location //=> 'dry'
 */
export function plainConditions(volts: number): FixtureConditions {
  return { enclosed: false, dimmer: 'none', location: 'dry', emergencyCircuit: false, insulationContact: false, circuitVolts: volts };
}

/**
 * Existing equipment from a row of the built-in list. The input watts are
 * left to the calculation, which finds the same row and says where its
 * figure comes from; typing fixture input watts overrides it.
 *
 * @example existingFromTypical(typicalExistingEquipment[0]).lampsPerFixture //=> 4
 */
export function existingFromTypical(row: TypicalEquipment): ExistingEquipment {
  return {
    technology: row.technology,
    description: row.label,
    lampsPerFixture: row.lampsPerFixture,
    ratedWattsPerLamp: row.ratedWattsPerLamp,
    ballast: row.ballast,
  };
}

/**
 * A new entry: one fixture of the given existing equipment, no proposal yet.
 *
 * @example newEntryFields(existing, 120).count //=> 1
 */
export function newEntryFields(existing: ExistingEquipment, volts: number): NewEntry {
  return { count: 1, existing, conditions: plainConditions(volts), proposed: null, control: 'none', notes: '' };
}
