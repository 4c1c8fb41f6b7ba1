/**
 * Validation of Lampwalk survey files (backup exports and command-line input)
 * and of single surveys, with one schema per type of `src/survey/model.ts`.
 *
 * Everything read from disk, storage or another program goes through here
 * before the rest of the app sees it. Every problem is reported with the path
 * of the offending value (`surveys[0].rooms[2].entries[1].count`) and a plain
 * message naming what was expected and what was found. Unknown fields are
 * reported too, so a typo in a hand-edited file does not silently drop data.
 *
 * The format itself is described in `docs/file-format.md`.
 */
import * as v from 'valibot';
import { CalcInputError } from '../calc/errors.ts';
import { isKnownCurrency } from '../calc/units.ts';
import { fileFormatName, fileFormatVersion, type SurveyFile, type SurveyFilePhoto } from './format.ts';
import type {
  BallastKind,
  BuildingType,
  CatalogProduct,
  ControlChange,
  DimmerKind,
  Distribution,
  ExistingEquipment,
  ExistingTechnology,
  FixtureConditions,
  FixtureEntry,
  GridFactorChoice,
  HeatingType,
  HoursOfUse,
  LayoutEntryCount,
  LayoutException,
  MoistureRating,
  MoneyAssumptions,
  PhasePlanSettings,
  PhotoMimeType,
  PhotoOwnerKind,
  Portfolio,
  ProductForm,
  ProposedProduct,
  RepeatedLayout,
  Room,
  RoomPhotometry,
  SavingsAssumptions,
  SpaceType,
  Survey,
  TubeType,
  UnitsSystem,
} from './model.ts';

/** One thing wrong with a file, at the path of the offending value. */
export interface FileProblem {
  /** Where, e.g. `surveys[0].rooms[2].entries[1].existing.ratedWattsPerLamp`; `(file)` for the whole file. */
  path: string;
  /** What is wrong, in plain words, naming what was expected and what was found. */
  message: string;
}

/** Outcome of reading a survey file: the file, or the problems found in it. */
export type ParseResult = { ok: true; file: SurveyFile } | { ok: false; problems: FileProblem[] };

/** Outcome of reading one survey. */
export type SurveyParseResult = { ok: true; survey: Survey } | { ok: false; problems: FileProblem[] };

/** Most problems listed for one file; the last line then says how many more there are. */
export const maxProblems = 50;

/** Default size limit for survey file text, in bytes of UTF-8 (50 MB). */
export const defaultMaxFileBytes = 50_000_000;

/** Longest id, in characters. */
export const maxIdLength = 200;

/** Longest text field (names, notes, addresses), in characters. */
export const maxTextLength = 10_000;

// ---------------------------------------------------------------------------
// Messages

/** Short, plain description of a value for "(got …)". */
function describe(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (typeof value === 'string') {
    if (value.length > 40) return `text ${JSON.stringify(value.slice(0, 40))}… (${value.length} characters)`;
    return `text ${JSON.stringify(value)}`;
  }
  if (typeof value === 'boolean') return String(value);
  if (Array.isArray(value)) return `a list of ${value.length} item${value.length === 1 ? '' : 's'}`;
  if (typeof value === 'object') return 'an object';
  return `a ${typeof value}`;
}

function quoteList(options: readonly string[]): string {
  return options.map((option) => JSON.stringify(option)).join(', ');
}

// ---------------------------------------------------------------------------
// Building blocks

interface NumberRule {
  /** Whole numbers only. */
  integer?: boolean;
  /** The minimum itself is not allowed (`> min` rather than `≥ min`). */
  minExclusive?: boolean;
}

/**
 * A finite number in a range; NaN, Infinity, text such as "1,5" and null are
 * refused. One message covers every failure, e.g.
 * "must be a number between 0 and 8760 (got 9000)".
 */
function numberIn(min: number, max: number, rule: NumberRule = {}) {
  const { integer = false, minExclusive = false } = rule;
  const noun = integer ? 'a whole number' : 'a number';
  let range: string;
  if (max === Infinity) range = minExclusive ? `greater than ${min}` : `of ${min} or more`;
  else range = minExclusive ? `greater than ${min} and at most ${max}` : `between ${min} and ${max}`;
  const expected = `must be ${noun} ${range}`;
  const message = (issue: v.BaseIssue<unknown>): string =>
    typeof issue.input === 'string'
      ? `${expected}, written without quotes and with "." for decimals (got ${describe(issue.input)})`
      : `${expected} (got ${describe(issue.input)})`;
  return v.pipe(
    v.number(message),
    v.check(
      (value: number) =>
        Number.isFinite(value) &&
        (minExclusive ? value > min : value >= min) &&
        value <= max &&
        (!integer || Number.isInteger(value)),
      message,
    ),
  );
}

/** Text of at most `maxLength` characters, optionally required to be non-empty. */
function textOf(maxLength: number, nonEmpty: boolean, expected: string) {
  const message = (issue: v.BaseIssue<unknown>): string =>
    typeof issue.input === 'string' && issue.input.length > 0
      ? `${expected} (got ${issue.input.length} characters)`
      : `${expected} (got ${describe(issue.input)})`;
  return v.pipe(
    v.string(message),
    v.check((value: string) => value.length <= maxLength && (!nonEmpty || value.length > 0), message),
  );
}

const text = textOf(maxTextLength, false, `must be text of at most ${maxTextLength} characters`);
const nonEmptyText = textOf(maxTextLength, true, `must be non-empty text of at most ${maxTextLength} characters`);
const id = textOf(maxIdLength, true, `must be an id: non-empty text of at most ${maxIdLength} characters`);

const flag = v.boolean((issue) => `must be true or false (got ${describe(issue.input)})`);

function oneOf<const TOptions extends readonly string[]>(options: TOptions) {
  return v.picklist(options, (issue) => `must be one of ${quoteList(options)} (got ${describe(issue.input)})`);
}

function listOf<TItem extends v.GenericSchema>(item: TItem, what: string) {
  return v.array(item, (issue) => `must be a list of ${what} (got ${describe(issue.input)})`);
}

/**
 * A JSON object with exactly these fields: missing fields and unknown fields
 * (typos, `__proto__`, `constructor`) are reported.
 */
function record<const TEntries extends v.ObjectEntries>(entries: TEntries, what: string) {
  const allowed = Object.keys(entries);
  return v.strictObject(entries, (issue) => {
    if (issue.expected === 'never') {
      return `is not a field of ${what}; check the spelling (its fields are ${allowed.join(', ')})`;
    }
    if (issue.input === undefined && issue.expected !== 'Object') {
      return `is missing: required in ${what}`;
    }
    return `must be a JSON object describing ${what} (got ${describe(issue.input)})`;
  });
}

/** A tagged union told apart by its `kind` field. */
function kindOf<const TOptions extends v.VariantOptions<'kind'>>(
  kinds: readonly string[],
  what: string,
  options: TOptions,
) {
  return v.variant('kind', options, (issue) =>
    issue.path
      ? `must be one of ${quoteList(kinds)} (got ${describe(issue.input)})`
      : `must be a JSON object describing ${what} (got ${describe(issue.input)})`,
  );
}

const isoTimestampPattern =
  /^(\d{4})-(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])T([01]\d|2[0-3]):[0-5]\d(:[0-5]\d(\.\d{1,9})?)?(Z|[+-]([01]\d|2[0-3]):[0-5]\d)$/;

/** True for an ISO 8601 date and time with a zone, on a real calendar day, that `Date.parse` reads. */
function isIsoTimestamp(value: string): boolean {
  const match = isoTimestampPattern.exec(value);
  if (!match) return false;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  const daysInMonth = month === 2 ? (leap ? 29 : 28) : [4, 6, 9, 11].includes(month) ? 30 : 31;
  return day <= daysInMonth && !Number.isNaN(Date.parse(value));
}

const timestampMessage = (issue: v.BaseIssue<unknown>): string =>
  `must be an ISO 8601 date and time with a time zone, such as "2024-05-01T09:30:00Z" (got ${describe(issue.input)})`;
const timestamp = v.pipe(v.string(timestampMessage), v.check(isIsoTimestamp, timestampMessage));

/** True when `Intl` accepts `tag` as a BCP 47 language tag. */
function isLocale(tag: string): boolean {
  try {
    Intl.getCanonicalLocales(tag);
    return true;
  } catch (error) {
    if (error instanceof RangeError) return false;
    throw error;
  }
}

const localeMessage = (issue: v.BaseIssue<unknown>): string =>
  `must be a BCP 47 language tag such as "en-US", "en-GB" or "de-DE" (got ${describe(issue.input)})`;
const locale = v.pipe(
  v.string(localeMessage),
  v.check((tag: string) => tag.length <= maxIdLength && isLocale(tag), localeMessage),
);

const currencyMessage = (issue: v.BaseIssue<unknown>): string =>
  `must be an ISO 4217 currency code in capitals, such as "USD", "EUR" or "GBP" (got ${describe(issue.input)})`;
const currency = v.pipe(v.string(currencyMessage), v.check(isKnownCurrency, currencyMessage));

// Shared ranges.
const watts = numberIn(0, 100_000);
const ratedWatts = numberIn(0, 100_000, { minExclusive: true });
const lumens = numberIn(0, 1e7);
const cctKelvin = numberIn(1000, 10_000);
const cri = numberIn(0, 100);
const powerFactor = numberIn(0.1, 1);
const lifeHours = numberIn(1, 1_000_000);
const hoursPerYear = numberIn(0, 8760);
const cost = numberIn(0, Infinity);
const lampsPerFixture = numberIn(1, 24, { integer: true });
const length = numberIn(0, 1000, { minExclusive: true });

// ---------------------------------------------------------------------------
// Closed sets (each list must hold exactly the members of its model union; the
// compile-time check at the bottom of this file fails if one drifts).

const unitsSystems = ['si', 'imperial'] as const satisfies readonly UnitsSystem[];
const buildingTypes = [
  'office-large',
  'office-small',
  'school',
  'retail',
  'warehouse',
  'restaurant',
  'hospital',
  'exterior',
  'multifamily',
  'other',
] as const satisfies readonly BuildingType[];
const heatingTypes = [
  'electric-resistance',
  'heat-pump',
  'fossil',
  'refrigerated',
  'unconditioned',
] as const satisfies readonly HeatingType[];
const spaceTypes = [
  'office-enclosed',
  'office-open',
  'conference',
  'corridor',
  'restroom',
  'stairwell',
  'lobby',
  'breakroom',
  'classroom',
  'retail-sales',
  'storage',
  'warehouse-bulky',
  'warehouse-small-items',
  'parking-interior',
  'food-preparation',
  'dining',
  'laboratory',
  'gymnasium',
  'guest-room',
  'dwelling-unit',
] as const satisfies readonly SpaceType[];
const existingTechnologies = [
  'incandescent',
  'halogen',
  'cfl-screw',
  'cfl-pin',
  'linear-t12',
  'linear-t8',
  'linear-t5',
  'metal-halide',
  'high-pressure-sodium',
  'mercury-vapour',
  'led',
  'other',
] as const satisfies readonly ExistingTechnology[];
const ballastKinds = ['none', 'magnetic', 'electronic'] as const satisfies readonly BallastKind[];
const dimmerKinds = ['none', 'leading-edge', 'trailing-edge', '0-10v', 'unknown'] as const satisfies readonly DimmerKind[];
const moistureRatings = ['dry', 'damp', 'wet'] as const satisfies readonly MoistureRating[];
const tubeTypes = ['not-a-tube', 'type-a', 'type-b', 'type-c', 'type-a-b'] as const satisfies readonly TubeType[];
const productForms = [
  'screw-lamp',
  'pin-lamp',
  'linear-tube',
  'luminaire',
  'retrofit-kit',
] as const satisfies readonly ProductForm[];
const distributions = [
  'direct-narrow',
  'direct-wide',
  'semi-direct',
  'diffuse',
  'indirect',
] as const satisfies readonly Distribution[];
const controlChanges = [
  'none',
  'occupancy-sensor',
  'vacancy-sensor',
  'daylight-dimming',
  'timer',
] as const satisfies readonly ControlChange[];
const taxBases = ['materials', 'everything'] as const satisfies readonly MoneyAssumptions['taxBase'][];
const photoMimeTypes = ['image/jpeg', 'image/png', 'image/webp'] as const satisfies readonly PhotoMimeType[];
const photoOwnerKinds = ['room', 'entry'] as const satisfies readonly PhotoOwnerKind[];

// ---------------------------------------------------------------------------
// Schemas, one per model type.

/** Schema for {@link GridFactorChoice}. */
export const gridFactorChoiceSchema = kindOf(['egrid', 'uk', 'custom'], 'a grid emission factor', [
  record({ kind: v.literal('egrid'), subregion: nonEmptyText }, 'an eGRID grid factor'),
  record({ kind: v.literal('uk'), year: numberIn(2000, 2100, { integer: true }) }, 'a UK grid factor'),
  record(
    { kind: v.literal('custom'), kgCo2PerKwh: numberIn(0, 2.5), label: text },
    'a custom grid factor',
  ),
]);

const hoursInDay = numberIn(0, 24);

/** Schema for {@link HoursOfUse}. */
export const hoursOfUseSchema = kindOf(['annual', 'weekly'], 'hours of use', [
  record({ kind: v.literal('annual'), hoursPerYear }, 'annual hours of use'),
  record(
    {
      kind: v.literal('weekly'),
      days: v.strictTuple([hoursInDay, hoursInDay, hoursInDay, hoursInDay, hoursInDay, hoursInDay, hoursInDay], (issue) =>
        issue.expected === 'never'
          ? 'is one day too many: a week has 7 days, Monday first'
          : `must be a list of 7 daily hours, Monday first (got ${describe(issue.input)})`,
      ),
      weeksPerYear: v.exactOptional(numberIn(1, 53)),
    },
    'a weekly schedule',
  ),
]);

/** Schema for {@link SavingsAssumptions}. */
export const savingsAssumptionsSchema = record(
  {
    hvacEnergyFactor: v.exactOptional(numberIn(0, 3)),
    hvacDemandFactor: v.exactOptional(numberIn(0, 3)),
    coincidenceFactor: v.exactOptional(numberIn(0, 1)),
    gasThermsPerKwhSaved: v.exactOptional(numberIn(-1, 1)),
    defaultHoursPerYear: v.exactOptional(hoursPerYear),
  },
  'savings assumptions',
);

/** Schema for {@link MoneyAssumptions}. */
export const moneyAssumptionsSchema = record(
  {
    currency,
    energyRatePerKwh: numberIn(0, 100),
    demandChargePerKwMonth: numberIn(0, 10_000),
    energyEscalationPerYear: numberIn(-0.5, 0.5),
    discountRatePerYear: numberIn(0, 0.5),
    analysisYears: numberIn(1, 40, { integer: true }),
    labourRatePerHour: numberIn(0, 10_000),
    markupFraction: numberIn(0, 5),
    taxFraction: numberIn(0, 1),
    taxBase: oneOf(taxBases),
    lampRecyclingCostEach: cost,
    ballastDisposalCostEach: cost,
    relampMinutes: numberIn(0, 600),
  },
  'money assumptions',
);

/** Schema for {@link RoomPhotometry}. */
export const roomPhotometrySchema = record(
  {
    coefficientOfUtilisation: v.exactOptional(numberIn(0, 1.5)),
    lightLossFactor: v.exactOptional(numberIn(0, 1.5)),
    luminaireDirtDepreciation: v.exactOptional(numberIn(0, 1)),
    roomSurfaceDirtDepreciation: v.exactOptional(numberIn(0, 1)),
  },
  'room photometry',
);

/** Schema for {@link ExistingEquipment}. */
export const existingEquipmentSchema = record(
  {
    technology: oneOf(existingTechnologies),
    description: text,
    lampsPerFixture,
    ratedWattsPerLamp: ratedWatts,
    fixtureInputWatts: v.exactOptional(watts),
    meteredWattsPerFixture: v.exactOptional(watts),
    lumensPerLamp: v.exactOptional(lumens),
    ballast: oneOf(ballastKinds),
    ballastFactor: v.exactOptional(numberIn(0.3, 1.5)),
    ballastYear: v.exactOptional(numberIn(1900, 2100, { integer: true })),
    luminaireEfficiency: v.exactOptional(numberIn(0.1, 1)),
    powerFactor: v.exactOptional(powerFactor),
    cctKelvin: v.exactOptional(cctKelvin),
    cri: v.exactOptional(cri),
    lampLifeHours: v.exactOptional(lifeHours),
    lampPrice: v.exactOptional(cost),
  },
  'existing equipment',
);

/** Schema for {@link FixtureConditions}. */
export const fixtureConditionsSchema = record(
  {
    enclosed: flag,
    dimmer: oneOf(dimmerKinds),
    location: oneOf(moistureRatings),
    emergencyCircuit: flag,
    insulationContact: flag,
    circuitVolts: numberIn(12, 1000),
    breakerAmps: v.exactOptional(numberIn(1, 1000)),
    circuitLabel: v.exactOptional(text),
  },
  'fixture conditions',
);

/** Highest rated input voltage a product may record. */
const maxVolts = 1000;

/** Fields shared by a proposed product and a catalog product. */
const productEntries = {
  name: text,
  form: oneOf(productForms),
  tubeType: oneOf(tubeTypes),
  unitsPerFixture: lampsPerFixture,
  wattsPerUnit: ratedWatts,
  lumensPerUnit: lumens,
  cctKelvin,
  cri,
  powerFactor,
  inputVoltsMin: v.exactOptional(numberIn(1, maxVolts)),
  inputVoltsMax: v.exactOptional(numberIn(1, maxVolts)),
  dimmable: flag,
  enclosedRated: flag,
  moistureRating: oneOf(moistureRatings),
  insulationContactRated: flag,
  emergencyListed: flag,
  ratedLifeHours: lifeHours,
  distribution: oneOf(distributions),
  unitCost: cost,
  installMinutesPerFixture: numberIn(0, 6000),
  rebatePerFixture: cost,
};

/**
 * The lowest rated input voltage may not lie above the highest. Values that
 * failed their own range check are skipped (valibot still runs this check),
 * so a bad voltage is reported once.
 */
function voltsInOrder(product: { inputVoltsMin?: number; inputVoltsMax?: number }): boolean {
  const { inputVoltsMin: low, inputVoltsMax: high } = product;
  const valid = (volts: unknown): volts is number => typeof volts === 'number' && Number.isFinite(volts) && volts >= 1 && volts <= maxVolts;
  return !valid(low) || !valid(high) || low <= high;
}

const voltsOrderMessage = (issue: v.BaseIssue<{ inputVoltsMin?: number; inputVoltsMax?: number }>): string =>
  `must not be below the lowest input voltage of ${issue.input.inputVoltsMin} V (got ${issue.input.inputVoltsMax})`;

/** Schema for {@link ProposedProduct}; the lowest input voltage may not lie above the highest. */
export const proposedProductSchema = v.pipe(
  record({ catalogId: v.exactOptional(id), ...productEntries }, 'a proposed product'),
  v.forward(v.partialCheck([['inputVoltsMin'], ['inputVoltsMax']], voltsInOrder, voltsOrderMessage), ['inputVoltsMax']),
);

/** Schema for {@link CatalogProduct}; the lowest input voltage may not lie above the highest. */
export const catalogProductSchema = v.pipe(
  record({ id, ...productEntries, example: flag, retired: flag, sku: text }, 'a catalog product'),
  v.forward(v.partialCheck([['inputVoltsMin'], ['inputVoltsMax']], voltsInOrder, voltsOrderMessage), ['inputVoltsMax']),
);

/** Schema for {@link FixtureEntry}. */
export const fixtureEntrySchema = record(
  {
    id,
    count: numberIn(0, 100_000, { integer: true }),
    existing: existingEquipmentSchema,
    conditions: fixtureConditionsSchema,
    proposed: v.nullable(proposedProductSchema),
    control: oneOf(controlChanges),
    controlSavingsFraction: v.exactOptional(numberIn(0, 0.9)),
    notes: text,
  },
  'a fixture entry',
);

/** Schema for a room's floor plan. */
export const floorSchema = kindOf(['area', 'rectangle'], 'a floor plan', [
  record({ kind: v.literal('area'), squareMetres: numberIn(0, 1e6, { minExclusive: true }) }, 'a floor area'),
  record({ kind: v.literal('rectangle'), lengthMetres: length, widthMetres: length }, 'a rectangular floor'),
]);

const maxCeilingHeightMetres = 100;

/**
 * Work plane below the ceiling. Heights that failed their own range check
 * are skipped here (valibot still runs this check then), so a bad height is
 * reported once, not twice.
 */
function workPlaneBelowCeiling(room: { ceilingHeightMetres: number; workPlaneHeightMetres: number }): boolean {
  const ceiling = room.ceilingHeightMetres;
  const workPlane = room.workPlaneHeightMetres;
  const ceilingValid = Number.isFinite(ceiling) && ceiling > 0 && ceiling <= maxCeilingHeightMetres;
  const workPlaneValid = Number.isFinite(workPlane) && workPlane >= 0 && workPlane <= maxCeilingHeightMetres;
  return !ceilingValid || !workPlaneValid || workPlane < ceiling;
}

/** Schema for {@link Room}; the work plane must lie below the ceiling. */
export const roomSchema = v.pipe(
  record(
    {
      id,
      name: text,
      spaceType: oneOf(spaceTypes),
      floor: floorSchema,
      ceilingHeightMetres: numberIn(0, maxCeilingHeightMetres, { minExclusive: true }),
      workPlaneHeightMetres: numberIn(0, maxCeilingHeightMetres),
      hours: hoursOfUseSchema,
      colourCritical: flag,
      preferredCctKelvin: v.exactOptional(cctKelvin),
      photometry: roomPhotometrySchema,
      entries: listOf(fixtureEntrySchema, 'fixture entries'),
      notes: text,
    },
    'a room',
  ),
  v.forward(
    v.partialCheck(
      [['ceilingHeightMetres'], ['workPlaneHeightMetres']],
      workPlaneBelowCeiling,
      (issue) =>
        `must be below the ceiling height of ${issue.input.ceilingHeightMetres} m (got ${issue.input.workPlaneHeightMetres})`,
    ),
    ['workPlaneHeightMetres'],
  ),
);

/** Most units one layout may stand for. */
export const maxLayoutUnits = 10_000;

/** Schema for {@link LayoutEntryCount}. */
export const layoutEntryCountSchema = record(
  { entryId: id, count: numberIn(0, 100_000, { integer: true }) },
  'a fixture count for one entry in a unit',
);

/** Schema for {@link LayoutException} (that its entry ids are in the survey is checked apart). */
export const layoutExceptionSchema = record(
  { id, unitLabel: text, entryCounts: listOf(layoutEntryCountSchema, 'fixture counts'), notes: text },
  'a unit that differs from its layout',
);

/** Schema for {@link RepeatedLayout}; there cannot be more differing units than units. */
export const repeatedLayoutSchema = v.pipe(
  record(
    {
      unitCount: numberIn(1, maxLayoutUnits, { integer: true }),
      exceptions: listOf(layoutExceptionSchema, 'units that differ'),
    },
    'a repeated layout',
  ),
  v.forward(
    v.partialCheck(
      [['unitCount'], ['exceptions']],
      (layout: { unitCount: number; exceptions: readonly unknown[] }) =>
        !Number.isInteger(layout.unitCount) || layout.exceptions.length <= layout.unitCount,
      (issue) =>
        `lists more differing units than the layout has units (${issue.input.unitCount}); raise the unit count or remove a unit`,
    ),
    ['exceptions'],
  ),
);

/** Schema for {@link Survey}. */
export const surveySchema = record(
  {
    id,
    name: text,
    site: record({ name: text, address: text }, 'a site'),
    client: record({ name: text, contact: text }, 'a client'),
    preparedBy: text,
    buildingType: oneOf(buildingTypes),
    heatingType: oneOf(heatingTypes),
    cooled: flag,
    units: oneOf(unitsSystems),
    locale,
    money: moneyAssumptionsSchema,
    savings: savingsAssumptionsSchema,
    grid: gridFactorChoiceSchema,
    rooms: listOf(roomSchema, 'rooms'),
    notes: text,
    layout: v.exactOptional(repeatedLayoutSchema),
    createdAt: timestamp,
    updatedAt: timestamp,
  },
  'a survey',
);

/** True for non-empty base64 text: RFC 4648 standard alphabet, padded to a multiple of 4 characters. */
function isBase64(value: string): boolean {
  return value.length > 0 && value.length % 4 === 0 && /^[A-Za-z0-9+/]*={0,2}$/.test(value);
}

const base64Message = (issue: v.BaseIssue<unknown>): string =>
  `must be non-empty base64 text (letters, digits, "+" and "/", padded with "=" to a multiple of 4 characters) (got ${describe(issue.input)})`;
const base64 = v.pipe(v.string(base64Message), v.check(isBase64, base64Message));
const pixels = numberIn(1, 100_000, { integer: true });

/** Schema for {@link SurveyFilePhoto} (that its survey and owner are in the file is checked apart). */
export const photoSchema = record(
  {
    id,
    ownerKind: oneOf(photoOwnerKinds),
    ownerId: id,
    surveyId: id,
    mimeType: oneOf(photoMimeTypes),
    widthPixels: pixels,
    heightPixels: pixels,
    createdAt: timestamp,
    imageBase64: base64,
    thumbnailMimeType: oneOf(photoMimeTypes),
    thumbnailBase64: base64,
  },
  'a photo',
);

/** Schema for {@link PhasePlanSettings}. */
export const phasePlanSettingsSchema = record(
  { budgetPerYear: cost, years: numberIn(1, 20, { integer: true }) },
  'phased plan settings',
);

/** Schema for {@link Portfolio} (that its surveys are in the file is checked apart). */
export const portfolioSchema = record(
  {
    id,
    name: text,
    client: record({ name: text, contact: text }, 'a client'),
    surveyIds: listOf(id, 'survey ids'),
    plan: phasePlanSettingsSchema,
    notes: text,
    createdAt: timestamp,
    updatedAt: timestamp,
  },
  'a portfolio',
);

/** Schema for a current-version {@link SurveyFile} (without the id-uniqueness and photo-link checks). */
export const surveyFileSchema = record(
  {
    format: v.literal(fileFormatName, (issue) => `must be "${fileFormatName}" (got ${describe(issue.input)})`),
    version: v.literal(
      fileFormatVersion,
      (issue) =>
        `must be the file format version, a whole number from 1 to ${fileFormatVersion} for this Lampwalk (got ${describe(issue.input)})`,
    ),
    exportedAt: timestamp,
    surveys: listOf(surveySchema, 'surveys'),
    catalog: listOf(catalogProductSchema, 'catalog products'),
    photos: listOf(photoSchema, 'photos'),
    portfolios: listOf(portfolioSchema, 'portfolios'),
  },
  'a Lampwalk survey file',
);

// ---------------------------------------------------------------------------
// Compile-time proof that the schemas and the model agree field for field
// (names, optionality, literal sets). If model.ts changes, this stops compiling
// with "Type 'true' is not assignable to type 'false'" on the line of the
// schema that no longer matches: update that schema (and docs/file-format.md).

/** Flattens intersections so that two structurally equal types compare equal. */
type Normalize<T> = T extends readonly unknown[]
  ? { [K in keyof T]: Normalize<T[K]> }
  : T extends object
    ? { [K in keyof T]: Normalize<T[K]> }
    : T;
type Same<A, B> =
  (<T>() => T extends Normalize<A> ? 1 : 2) extends <T>() => T extends Normalize<B> ? 1 : 2 ? true : false;

const schemasMatchModel: [
  Same<v.InferOutput<typeof surveyFileSchema>, SurveyFile>,
  Same<v.InferOutput<typeof surveySchema>, Survey>,
  Same<v.InferOutput<typeof roomSchema>, Room>,
  Same<v.InferOutput<typeof fixtureEntrySchema>, FixtureEntry>,
  Same<v.InferOutput<typeof existingEquipmentSchema>, ExistingEquipment>,
  Same<v.InferOutput<typeof fixtureConditionsSchema>, FixtureConditions>,
  Same<v.InferOutput<typeof proposedProductSchema>, ProposedProduct>,
  Same<v.InferOutput<typeof catalogProductSchema>, CatalogProduct>,
  Same<v.InferOutput<typeof roomPhotometrySchema>, RoomPhotometry>,
  Same<v.InferOutput<typeof hoursOfUseSchema>, HoursOfUse>,
  Same<v.InferOutput<typeof gridFactorChoiceSchema>, GridFactorChoice>,
  Same<v.InferOutput<typeof moneyAssumptionsSchema>, MoneyAssumptions>,
  Same<v.InferOutput<typeof savingsAssumptionsSchema>, SavingsAssumptions>,
  Same<v.InferOutput<typeof floorSchema>, Room['floor']>,
  Same<v.InferOutput<typeof photoSchema>, SurveyFilePhoto>,
  Same<v.InferOutput<typeof repeatedLayoutSchema>, RepeatedLayout>,
  Same<v.InferOutput<typeof layoutExceptionSchema>, LayoutException>,
  Same<v.InferOutput<typeof layoutEntryCountSchema>, LayoutEntryCount>,
  Same<v.InferOutput<typeof portfolioSchema>, Portfolio>,
  Same<v.InferOutput<typeof phasePlanSettingsSchema>, PhasePlanSettings>,
] = [true, true, true, true, true, true, true, true, true, true, true, true, true, true, true, true, true, true, true, true];
void schemasMatchModel;

// ---------------------------------------------------------------------------
// Problems

function pathOf(issue: v.BaseIssue<unknown>, prefix: string, root: string): string {
  let path = prefix;
  for (const item of issue.path ?? []) {
    const key: unknown = item.key;
    if (typeof key === 'number') path += `[${key}]`;
    else if (typeof key === 'string' && /^[A-Za-z_$][\w$]*$/.test(key)) path += path === '' ? key : `.${key}`;
    else path += `[${JSON.stringify(String(key))}]`;
  }
  return path === '' ? root : path;
}

function toProblems(issues: readonly v.BaseIssue<unknown>[], prefix: string, root: string): FileProblem[] {
  return issues.map((issue) => ({ path: pathOf(issue, prefix, root), message: issue.message }));
}

/** Keeps at most {@link maxProblems} lines, the last one counting the rest. */
function capped(problems: FileProblem[], root: string): FileProblem[] {
  if (problems.length <= maxProblems) return problems;
  const rest = problems.length - (maxProblems - 1);
  return [
    ...problems.slice(0, maxProblems - 1),
    { path: root, message: `${rest} more problems not listed; fix the ones above and check again` },
  ];
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Own property only, so nothing is read through the prototype chain. */
function own(value: Record<string, unknown>, key: string): unknown {
  return Object.hasOwn(value, key) ? value[key] : undefined;
}

function ownList(value: unknown, key: string): unknown[] {
  if (!isObject(value)) return [];
  const list = own(value, key);
  return Array.isArray(list) ? list : [];
}

/**
 * Finds ids used twice. Surveys, rooms and entries share one set of ids;
 * catalog products have their own. Works on unvalidated input, so duplicates
 * are reported alongside other problems.
 */
class IdRegister {
  readonly problems: FileProblem[] = [];
  private readonly seen = new Map<string, string>();

  constructor(private readonly what: string) {}

  note(value: unknown, path: string): void {
    if (!isObject(value)) return;
    const idValue = own(value, 'id');
    if (typeof idValue !== 'string' || idValue === '') return;
    const first = this.seen.get(idValue);
    if (first === undefined) this.seen.set(idValue, path === '' ? 'the survey' : path);
    else {
      this.problems.push({
        path: join(path, 'id'),
        message: `${describe(idValue).replace(/^text /, 'id ')} is already used by ${first}; ${this.what}`,
      });
    }
  }
}

const surveyIdRule = 'every survey, room and fixture entry needs an id of its own';
const catalogIdRule = 'every catalog product needs an id of its own';
const photoIdRule = 'every photo needs an id of its own';

/** `base.key`, or just `key` at the top. */
function join(base: string, key: string): string {
  return base === '' ? key : `${base}.${key}`;
}

function registerSurveyIds(survey: unknown, path: string, register: IdRegister): void {
  register.note(survey, path);
  ownList(survey, 'rooms').forEach((room, roomIndex) => {
    const roomPath = join(path, `rooms[${roomIndex}]`);
    register.note(room, roomPath);
    ownList(room, 'entries').forEach((entry, entryIndex) => register.note(entry, `${roomPath}.entries[${entryIndex}]`));
  });
}

/**
 * Checks that each photo belongs to a survey in the file and shows a room or
 * entry of that survey. Works on unvalidated input (values of the wrong type
 * are left to the schema), so these problems are listed with the others.
 */
function photoLinkProblems(file: unknown): FileProblem[] {
  const owners = new Map<string, { rooms: Set<string>; entries: Set<string> }>();
  for (const survey of ownList(file, 'surveys')) {
    if (!isObject(survey)) continue;
    const surveyId = own(survey, 'id');
    if (typeof surveyId !== 'string') continue;
    const known = { rooms: new Set<string>(), entries: new Set<string>() };
    for (const room of ownList(survey, 'rooms')) {
      if (!isObject(room)) continue;
      const roomId = own(room, 'id');
      if (typeof roomId === 'string') known.rooms.add(roomId);
      for (const entry of ownList(room, 'entries')) {
        const entryId = isObject(entry) ? own(entry, 'id') : undefined;
        if (typeof entryId === 'string') known.entries.add(entryId);
      }
    }
    owners.set(surveyId, known);
  }
  const problems: FileProblem[] = [];
  ownList(file, 'photos').forEach((photo, index) => {
    if (!isObject(photo)) return;
    const surveyId = own(photo, 'surveyId');
    const ownerId = own(photo, 'ownerId');
    const ownerKind = own(photo, 'ownerKind');
    if (typeof surveyId !== 'string' || surveyId === '') return;
    const known = owners.get(surveyId);
    if (!known) {
      problems.push({
        path: `photos[${index}].surveyId`,
        message: `survey ${JSON.stringify(surveyId)} is not in this file; a photo must belong to a survey in the same file`,
      });
      return;
    }
    if (typeof ownerId !== 'string' || ownerId === '') return;
    if (ownerKind === 'room' && !known.rooms.has(ownerId)) {
      problems.push({
        path: `photos[${index}].ownerId`,
        message: `survey ${JSON.stringify(surveyId)} has no room ${JSON.stringify(ownerId)}; a photo must show a room or entry of its survey`,
      });
    } else if (ownerKind === 'entry' && !known.entries.has(ownerId)) {
      problems.push({
        path: `photos[${index}].ownerId`,
        message: `survey ${JSON.stringify(surveyId)} has no fixture entry ${JSON.stringify(ownerId)}; a photo must show a room or entry of its survey`,
      });
    }
  });
  return problems;
}

/**
 * Checks a survey's repeated layout against its own entries: each differing
 * unit's entry ids name fixture entries of the survey (`entryIds`; the ids of
 * the survey itself when not given) and are listed once per unit, and no two
 * differing units share an id. Works on unvalidated input (values of the
 * wrong type are left to the schema). `path` is the survey's path.
 *
 * @example
 * layoutLinkProblems({ rooms: [], layout: { unitCount: 2, exceptions: [{ id: 'u1', entryCounts: [{ entryId: 'e9', count: 0 }] }] } }, 'surveys[0]')
 * //=> [{ path: 'surveys[0].layout.exceptions[0].entryCounts[0].entryId', message: 'names no fixture entry of this survey ("e9"); …' }]
 */
export function layoutLinkProblems(survey: unknown, path = '', entryIds?: ReadonlySet<string>): FileProblem[] {
  if (!isObject(survey)) return [];
  const layout = own(survey, 'layout');
  if (!isObject(layout)) return [];
  let known = entryIds;
  if (!known) {
    const ids = new Set<string>();
    for (const room of ownList(survey, 'rooms')) {
      for (const entry of ownList(room, 'entries')) {
        const entryId = isObject(entry) ? own(entry, 'id') : undefined;
        if (typeof entryId === 'string') ids.add(entryId);
      }
    }
    known = ids;
  }
  const problems: FileProblem[] = [];
  const unitIds = new Map<string, number>();
  ownList(layout, 'exceptions').forEach((unit, unitIndex) => {
    if (!isObject(unit)) return;
    const unitPath = join(path, `layout.exceptions[${unitIndex}]`);
    const unitId = own(unit, 'id');
    if (typeof unitId === 'string' && unitId !== '') {
      const first = unitIds.get(unitId);
      if (first === undefined) unitIds.set(unitId, unitIndex);
      else {
        problems.push({
          path: `${unitPath}.id`,
          message: `id ${JSON.stringify(unitId)} is already used by layout.exceptions[${first}]; every differing unit needs an id of its own`,
        });
      }
    }
    const listed = new Map<string, number>();
    ownList(unit, 'entryCounts').forEach((item, itemIndex) => {
      const entryId = isObject(item) ? own(item, 'entryId') : undefined;
      if (typeof entryId !== 'string' || entryId === '') return;
      const itemPath = `${unitPath}.entryCounts[${itemIndex}].entryId`;
      if (!known.has(entryId)) {
        problems.push({
          path: itemPath,
          message: `names no fixture entry of this survey (${JSON.stringify(entryId)}); a differing unit can only change the count of an entry of its own survey`,
        });
        return;
      }
      const first = listed.get(entryId);
      if (first === undefined) listed.set(entryId, itemIndex);
      else {
        problems.push({
          path: itemPath,
          message: `entry ${JSON.stringify(entryId)} is already counted in entryCounts[${first}] of this unit; give each entry one count per unit`,
        });
      }
    });
  });
  return problems;
}

/**
 * Checks that each portfolio's survey ids name surveys in `surveyIds` once
 * each, and that portfolio ids are unique. Works on unvalidated input.
 * `portfolios` is the file's list and `surveyIds` the file's surveys; the
 * store checks one portfolio against the stored surveys with
 * `{ path: () => '', place: 'device' }`.
 *
 * @example
 * portfolioLinkProblems([{ id: 'p1', surveyIds: ['s1', 's9'] }], new Set(['s1']))
 * //=> [{ path: 'portfolios[0].surveyIds[1]', message: 'survey "s9" is not in this file; …' }]
 */
export function portfolioLinkProblems(
  portfolios: readonly unknown[],
  surveyIds: ReadonlySet<string>,
  options: { path?: (index: number) => string; place?: 'file' | 'device' } = {},
): FileProblem[] {
  const pathOf = options.path ?? ((index: number) => `portfolios[${index}]`);
  const missing =
    options.place === 'device'
      ? 'is not on this device (it may have been deleted); a portfolio can only group stored surveys'
      : 'is not in this file; a portfolio can only group surveys in the same file';
  const problems: FileProblem[] = [];
  const register = new IdRegister('every portfolio needs an id of its own');
  portfolios.forEach((portfolio, index) => {
    register.note(portfolio, pathOf(index));
    const listed = new Map<string, number>();
    ownList(portfolio, 'surveyIds').forEach((surveyId, itemIndex) => {
      if (typeof surveyId !== 'string' || surveyId === '') return;
      const itemPath = join(pathOf(index), `surveyIds[${itemIndex}]`);
      if (!surveyIds.has(surveyId)) {
        problems.push({ path: itemPath, message: `survey ${JSON.stringify(surveyId)} ${missing}` });
        return;
      }
      const first = listed.get(surveyId);
      if (first === undefined) listed.set(surveyId, itemIndex);
      else {
        problems.push({
          path: itemPath,
          message: `survey ${JSON.stringify(surveyId)} is already listed at surveyIds[${first}]; list each survey once`,
        });
      }
    });
  });
  return [...register.problems, ...problems];
}

/** Ids of the surveys in an unvalidated file. */
function fileSurveyIds(file: unknown): Set<string> {
  const ids = new Set<string>();
  for (const survey of ownList(file, 'surveys')) {
    const surveyId = isObject(survey) ? own(survey, 'id') : undefined;
    if (typeof surveyId === 'string') ids.add(surveyId);
  }
  return ids;
}

// ---------------------------------------------------------------------------
// Versions

/**
 * Upgrades a file from version n to n + 1, keyed by n, filling in the new
 * fields. Never delete one: old backups must keep opening.
 */
const migrations: Partial<Record<number, (file: Record<string, unknown>) => Record<string, unknown>>> = {
  // Version 2 added photos; a version-1 file has none. (A `photos` field in a
  // version-1 file is left as it is and checked as version-2 photos.)
  1: (file) => (Object.hasOwn(file, 'photos') ? file : { ...file, photos: [] }),
  // Version 3 added portfolios (and the optional layout, preferred CCT and
  // product voltage fields, which older files simply lack).
  2: (file) => (Object.hasOwn(file, 'portfolios') ? file : { ...file, portfolios: [] }),
};

function migrateToCurrent(
  file: Record<string, unknown>,
  fromVersion: number,
): { ok: true; file: Record<string, unknown> } | { ok: false; problem: FileProblem } {
  let current = file;
  for (let version = fromVersion; version < fileFormatVersion; version++) {
    const migrate = migrations[version];
    if (!migrate) {
      return {
        ok: false,
        problem: { path: 'version', message: `file format version ${version} cannot be read by this Lampwalk` },
      };
    }
    current = { ...migrate(current), version: version + 1 };
  }
  return { ok: true, file: current };
}

// ---------------------------------------------------------------------------
// Public API

/**
 * Validates a whole survey file (already parsed from JSON): format name,
 * version, every field of every survey, room, entry, catalog product and
 * photo, that ids are unique and that every photo belongs to a room or entry
 * in the file. Older versions are migrated first (a version-1 file gets
 * `photos: []`). Lists up to {@link maxProblems} problems.
 *
 * @example
 * parseSurveyFile({ format: 'lampwalk-survey-file', version: 1, exportedAt: '2024-05-01T09:30:00Z', surveys: [], catalog: [] })
 * //=> { ok: true, file: { format: 'lampwalk-survey-file', version: 3, exportedAt: '2024-05-01T09:30:00Z', surveys: [], catalog: [], photos: [], portfolios: [] } }
 */
export function parseSurveyFile(input: unknown): ParseResult {
  if (!isObject(input)) {
    return {
      ok: false,
      problems: [
        {
          path: '(file)',
          message: `must be a JSON object with "format": "${fileFormatName}" (got ${describe(input)})`,
        },
      ],
    };
  }
  const format = own(input, 'format');
  if (format !== fileFormatName) {
    return {
      ok: false,
      problems: [
        {
          path: 'format',
          message: `not a Lampwalk survey file: "format" must be "${fileFormatName}" (got ${describe(format)})`,
        },
      ],
    };
  }
  const version = own(input, 'version');
  let current: Record<string, unknown> = input;
  if (typeof version === 'number' && Number.isInteger(version)) {
    if (version > fileFormatVersion) {
      return {
        ok: false,
        problems: [
          {
            path: 'version',
            message:
              `this file was written by a newer Lampwalk (file format version ${version}); this Lampwalk reads ` +
              `versions up to ${fileFormatVersion}. Open it with the newer Lampwalk, or update this one`,
          },
        ],
      };
    }
    if (version >= 1 && version < fileFormatVersion) {
      const migrated = migrateToCurrent(input, version);
      if (!migrated.ok) return { ok: false, problems: [migrated.problem] };
      current = migrated.file;
    }
  }

  const result = v.safeParse(surveyFileSchema, current);
  const problems = result.success ? [] : toProblems(result.issues, '', '(file)');
  const records = new IdRegister(surveyIdRule);
  ownList(current, 'surveys').forEach((survey, index) => registerSurveyIds(survey, `surveys[${index}]`, records));
  const products = new IdRegister(catalogIdRule);
  ownList(current, 'catalog').forEach((product, index) => products.note(product, `catalog[${index}]`));
  const photos = new IdRegister(photoIdRule);
  ownList(current, 'photos').forEach((photo, index) => photos.note(photo, `photos[${index}]`));
  problems.push(...records.problems, ...products.problems, ...photos.problems, ...photoLinkProblems(current));
  ownList(current, 'surveys').forEach((survey, index) => problems.push(...layoutLinkProblems(survey, `surveys[${index}]`)));
  problems.push(...portfolioLinkProblems(ownList(current, 'portfolios'), fileSurveyIds(current)));

  if (!result.success || problems.length > 0) return { ok: false, problems: capped(problems, '(file)') };
  return { ok: true, file: result.output };
}

function utf8ByteLengthUpTo(text: string, limit: number): number {
  let bytes = 0;
  for (let index = 0; index < text.length && bytes <= limit; index++) {
    const code = text.charCodeAt(index);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff && index + 1 < text.length) {
      const next = text.charCodeAt(index + 1);
      if (next >= 0xdc00 && next <= 0xdfff) {
        bytes += 4;
        index++;
      } else bytes += 3;
    } else bytes += 3;
  }
  return bytes;
}

function formatBytes(bytes: number): string {
  if (bytes >= 1_000_000) return `${Number((bytes / 1_000_000).toFixed(1))} MB`;
  if (bytes >= 1000) return `${Number((bytes / 1000).toFixed(1))} kB`;
  return `${bytes} bytes`;
}

/**
 * Reads survey file text: refuses text over `maxBytes` (UTF-8) before
 * parsing, reports text that is not JSON at path `(file)`, then validates it
 * with {@link parseSurveyFile}. A leading byte-order mark is ignored.
 *
 * @example
 * parseSurveyFileText('{"format": "lampwalk-survey-file"')
 * //=> { ok: false, problems: [{ path: '(file)', message: "not JSON: Expected ',' or '}' after property value in JSON at position 33" }] }
 * // (the text after "not JSON: " is the JavaScript engine's own and varies between engines)
 */
export function parseSurveyFileText(text: string, maxBytes: number = defaultMaxFileBytes): ParseResult {
  if (typeof maxBytes !== 'number' || !(maxBytes > 0) || maxBytes === Infinity) {
    throw new CalcInputError('maxBytes', `must be a positive number of bytes (got ${describe(maxBytes)})`);
  }
  if (typeof text !== 'string') {
    return { ok: false, problems: [{ path: '(file)', message: `must be text (got ${describe(text)})` }] };
  }
  if (utf8ByteLengthUpTo(text, maxBytes) > maxBytes) {
    return {
      ok: false,
      problems: [
        {
          path: '(file)',
          message: `is too large: over the ${formatBytes(maxBytes)} limit for a survey file (${maxBytes} bytes)`,
        },
      ],
    };
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(text.startsWith('\uFEFF') ? text.slice(1) : text);
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    return { ok: false, problems: [{ path: '(file)', message: `not JSON: ${detail}` }] };
  }
  return parseSurveyFile(parsed);
}

/**
 * Validates one survey (for example a survey object from storage or a single
 * survey sent by another program), including unique ids among its rooms and
 * entries. `path` prefixes every problem path, e.g. `surveys[3]`.
 *
 * @example
 * parseSurvey({ id: 's1' }, 'surveys[3]')
 * //=> { ok: false, problems: [{ path: 'surveys[3].name', message: 'is missing: required in a survey' }, …] }
 */
export function parseSurvey(input: unknown, path = ''): SurveyParseResult {
  const result = v.safeParse(surveySchema, input);
  const problems = result.success ? [] : toProblems(result.issues, path, '(survey)');
  const register = new IdRegister(surveyIdRule);
  registerSurveyIds(input, path, register);
  problems.push(...register.problems);
  problems.push(...layoutLinkProblems(input, path));
  if (!result.success || problems.length > 0) return { ok: false, problems: capped(problems, path === '' ? '(survey)' : path) };
  return { ok: true, survey: result.output };
}

/**
 * Checks one value against one of the schemas above (for example a fixture
 * entry the store is about to save) and returns its problems, each path
 * prefixed with `path`; an empty list means the value is valid.
 *
 * @example
 * problemsAgainst(fixtureConditionsSchema, { ...conditions, circuitVolts: 5 }, 'conditions')
 * //=> [{ path: 'conditions.circuitVolts', message: 'must be a number between 12 and 1000 (got 5)' }]
 */
export function problemsAgainst(schema: v.GenericSchema, input: unknown, path = ''): FileProblem[] {
  const result = v.safeParse(schema, input);
  return result.success ? [] : capped(toProblems(result.issues, path, path === '' ? '(value)' : path), path === '' ? '(value)' : path);
}
