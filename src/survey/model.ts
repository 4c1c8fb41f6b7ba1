/**
 * The Lampwalk domain model: what an auditor records on a walk.
 *
 * These are plain data types (no behaviour) shared by the calculation engine,
 * the store, the screens, the exporters and the command line. All physical
 * quantities are SI and carry their unit in the field name (`watts`,
 * `squareMetres`, `metres`, `hoursPerYear`); money is in the survey's currency
 * (`currency`, an ISO 4217 code). Imperial values exist only at the edges
 * (screens, reports) through `src/calc/units.ts`.
 *
 * The on-disk/backup format wrapping these types is described in
 * `docs/file-format.md` and validated by `src/survey/validate.ts`.
 */

/** Display system for lengths, areas and illuminance. Storage is always SI. */
export type UnitsSystem = 'si' | 'imperial';

/**
 * Building categories for HVAC interaction and default hours of use.
 * The first eight follow the building rows of the Bonneville Power
 * Administration "HVAC Interactive Effects" (2012) table.
 */
export type BuildingType =
  | 'office-large' // office 20,000–100,000 ft²
  | 'office-small' // office < 20,000 ft²
  | 'school'
  | 'retail'
  | 'warehouse'
  | 'restaurant'
  | 'hospital'
  | 'exterior'
  | 'multifamily'
  | 'other';

/** How the conditioned space is heated (drives the HVAC interactive factor). */
export type HeatingType =
  | 'electric-resistance'
  | 'heat-pump'
  | 'fossil' // gas or oil furnace/boiler
  | 'refrigerated' // refrigerated or freezer space
  | 'unconditioned';

/** Interior space types with published power-density and illuminance figures. */
export type SpaceType =
  | 'office-enclosed'
  | 'office-open'
  | 'conference'
  | 'corridor'
  | 'restroom'
  | 'stairwell'
  | 'lobby'
  | 'breakroom'
  | 'classroom'
  | 'retail-sales'
  | 'storage'
  | 'warehouse-bulky'
  | 'warehouse-small-items'
  | 'parking-interior'
  | 'food-preparation'
  | 'dining'
  | 'laboratory'
  | 'gymnasium'
  | 'guest-room'
  | 'dwelling-unit';

/** Lamp or light-source technology of the existing equipment. */
export type ExistingTechnology =
  | 'incandescent'
  | 'halogen'
  | 'cfl-screw'
  | 'cfl-pin'
  | 'linear-t12'
  | 'linear-t8'
  | 'linear-t5'
  | 'metal-halide'
  | 'high-pressure-sodium'
  | 'mercury-vapour'
  | 'led'
  | 'other';

/** Ballast kind on the existing equipment, where there is one. */
export type BallastKind = 'none' | 'magnetic' | 'electronic';

/** What kind of dimmer controls the circuit, if any. */
export type DimmerKind = 'none' | 'leading-edge' | 'trailing-edge' | '0-10v' | 'unknown';

/** Damp/wet exposure of the location, or the rating of a product. */
export type MoistureRating = 'dry' | 'damp' | 'wet';

/**
 * How a linear LED tube is powered (UL classification).
 * `not-a-tube` for lamps and luminaires that are not linear tubes.
 */
export type TubeType = 'not-a-tube' | 'type-a' | 'type-b' | 'type-c' | 'type-a-b';

/** Form of the proposed product. */
export type ProductForm = 'screw-lamp' | 'pin-lamp' | 'linear-tube' | 'luminaire' | 'retrofit-kit';

/** Photometric distribution class, used to pick a coefficient of utilisation. */
export type Distribution = 'direct-narrow' | 'direct-wide' | 'semi-direct' | 'diffuse' | 'indirect';

/** A lighting-control change proposed with the retrofit. */
export type ControlChange = 'none' | 'occupancy-sensor' | 'vacancy-sensor' | 'daylight-dimming' | 'timer';

/** The grid emission factor to use for CO2 avoided. */
export type GridFactorChoice =
  | { kind: 'egrid'; subregion: string }
  | { kind: 'uk'; year: number }
  | { kind: 'custom'; kgCo2PerKwh: number; label: string };

/** Hours of use: either an annual figure or a weekly pattern (× 52.143 weeks). */
export type HoursOfUse =
  | { kind: 'annual'; hoursPerYear: number }
  | {
      kind: 'weekly';
      /** Seven entries, Monday first. */
      days: [number, number, number, number, number, number, number];
      /** Weeks a year the schedule applies (holidays closed), default 52.143. */
      weeksPerYear?: number;
    };

/** Assumptions for the savings method; each one overrides a published default. */
export interface SavingsAssumptions {
  /** Energy interactive factor (1 + HVAC_c); overrides the BPA table default. */
  hvacEnergyFactor?: number;
  /** Demand interactive factor (1 + HVAC_d). */
  hvacDemandFactor?: number;
  /** Share of connected lighting load on at the utility peak, 0–1. */
  coincidenceFactor?: number;
  /** Gas heating penalty, therms per kWh saved (negative means more gas burned). */
  gasThermsPerKwhSaved?: number;
  /** Default annual hours when a room gives none. */
  defaultHoursPerYear?: number;
}

/** Money assumptions for one survey. */
export interface MoneyAssumptions {
  /** ISO 4217 code, e.g. "USD", "EUR", "GBP". */
  currency: string;
  /** Energy price per kWh in the survey currency. */
  energyRatePerKwh: number;
  /** Demand charge per kW-month; 0 when the tariff has none. */
  demandChargePerKwMonth: number;
  /** Real annual escalation of the energy price above general inflation, e.g. 0.02. */
  energyEscalationPerYear: number;
  /** Real discount rate per year, e.g. 0.03. */
  discountRatePerYear: number;
  /** Analysis period in whole years, 1–40. */
  analysisYears: number;
  /** Installer labour cost per hour. */
  labourRatePerHour: number;
  /** Markup on materials, labour and disposal, e.g. 0.15. */
  markupFraction: number;
  /** Sales tax rate, e.g. 0.08. */
  taxFraction: number;
  /** What the tax applies to. */
  taxBase: 'materials' | 'everything';
  /** Recycling cost per removed fluorescent or HID lamp. */
  lampRecyclingCostEach: number;
  /** Disposal cost per removed ballast (more for PCB-containing ones is the user's to enter). */
  ballastDisposalCostEach: number;
  /** Labour minutes to replace one failed lamp (for avoided-maintenance savings). */
  relampMinutes: number;
}

export interface Site {
  name: string;
  address: string;
}

export interface Client {
  name: string;
  contact: string;
}

/** A survey of one building (or one unit layout). */
export interface Survey {
  id: string;
  name: string;
  site: Site;
  client: Client;
  /** Who walked the building. */
  preparedBy: string;
  buildingType: BuildingType;
  heatingType: HeatingType;
  /** Whether the lit spaces are mechanically cooled (informational for now). */
  cooled: boolean;
  units: UnitsSystem;
  /** BCP 47 locale for numbers and dates, e.g. "en-US". */
  locale: string;
  money: MoneyAssumptions;
  savings: SavingsAssumptions;
  grid: GridFactorChoice;
  rooms: Room[];
  notes: string;
  /**
   * Set when this survey is one typical unit standing for several built the
   * same way (flats of one layout); absent for a one-off building.
   */
  layout?: RepeatedLayout;
  /** ISO 8601 timestamps. */
  createdAt: string;
  updatedAt: string;
}

/**
 * A surveyed unit that stands for `unitCount` units of the same layout.
 * Every total, order list and report multiplies by the units, less the
 * differences recorded in `exceptions`.
 */
export interface RepeatedLayout {
  /** Units built to this layout, the surveyed one included (1–10,000). */
  unitCount: number;
  /** Units that differ from the surveyed one; each is one of the `unitCount`. */
  exceptions: LayoutException[];
}

/** One unit that differs from its layout, e.g. a flat already converted. */
export interface LayoutException {
  id: string;
  /** Which unit, as the landlord names it ("Flat 3B"). */
  unitLabel: string;
  /**
   * Fixture counts in this unit where they differ from the surveyed unit, by
   * entry id; 0 when the fixture needs no change there (already converted, or
   * absent). Entries not listed have the surveyed count.
   */
  entryCounts: LayoutEntryCount[];
  notes: string;
}

export interface LayoutEntryCount {
  entryId: string;
  /** Fixtures of this entry in the unit (0–100,000). */
  count: number;
}

/** What the phased plan of a portfolio may spend. */
export interface PhasePlanSettings {
  /** Money available each year for the work, in the portfolio's currency (0 or more). */
  budgetPerYear: number;
  /** Years the work may be spread over, the first year included (1–20). */
  years: number;
}

/**
 * A group of surveys (buildings, or unit layouts) planned together: one
 * landlord's estate or one contractor's multi-site job. All its surveys must
 * use the same currency for roll-up totals and the phased plan.
 */
export interface Portfolio {
  id: string;
  name: string;
  client: Client;
  /** Surveys in the portfolio, in the order they are compared. */
  surveyIds: string[];
  plan: PhasePlanSettings;
  notes: string;
  /** ISO 8601 timestamps. */
  createdAt: string;
  updatedAt: string;
}

/** Lighting-design factor overrides for one room. */
export interface RoomPhotometry {
  /** Coefficient of utilisation 0–1.5; overrides the table lookup. */
  coefficientOfUtilisation?: number;
  /** Total light loss factor 0–1.5; overrides the product of the parts. */
  lightLossFactor?: number;
  /** Luminaire dirt depreciation 0–1 (default by room cleanliness). */
  luminaireDirtDepreciation?: number;
  /** Room surface dirt depreciation 0–1. */
  roomSurfaceDirtDepreciation?: number;
}

export interface Room {
  id: string;
  name: string;
  spaceType: SpaceType;
  /** Floor plan: either an area, or a length and a width. */
  floor: { kind: 'area'; squareMetres: number } | { kind: 'rectangle'; lengthMetres: number; widthMetres: number };
  ceilingHeightMetres: number;
  /** Height of the task plane above the floor (0.76 m desks, 0 for floors). */
  workPlaneHeightMetres: number;
  hours: HoursOfUse;
  /** True when colour rendering matters here (retail display, art, clinical). */
  colourCritical: boolean;
  /** Nominal colour temperature the client wants here (e.g. 3000); automatic product choice keeps to it. */
  preferredCctKelvin?: number;
  photometry: RoomPhotometry;
  entries: FixtureEntry[];
  notes: string;
}

/** What is installed now, per fixture. */
export interface ExistingEquipment {
  technology: ExistingTechnology;
  /** Free text shown in lists, e.g. "2×4 troffer, 3-lamp F32T8". */
  description: string;
  lampsPerFixture: number;
  ratedWattsPerLamp: number;
  /** Fixture input watts including ballast losses; defaults to lamps × rated watts. */
  fixtureInputWatts?: number;
  /** Watts measured with a meter for one fixture; wins over every rated figure. */
  meteredWattsPerFixture?: number;
  /** Initial lumens of one lamp. */
  lumensPerLamp?: number;
  ballast: BallastKind;
  /** Ballast factor 0.3–1.5; defaults by ballast kind. */
  ballastFactor?: number;
  /** Year the ballast was made, when a label shows it. */
  ballastYear?: number;
  /**
   * Share of the lamps' light that leaves the housing, 0.1–1; defaults by
   * technology. Lamps and tubes proposed for this housing lose the same share;
   * a proposed luminaire or kit is taken at its rated (delivered) lumens.
   */
  luminaireEfficiency?: number;
  /** Power factor of the existing fixture 0.1–1; defaults by technology. */
  powerFactor?: number;
  cctKelvin?: number;
  cri?: number;
  /** Rated lamp life in hours; defaults by technology. */
  lampLifeHours?: number;
  /** Price of one replacement lamp, for avoided-maintenance savings. */
  lampPrice?: number;
}

/** Where and how the fixture is installed. */
export interface FixtureConditions {
  /** Totally enclosed luminaire (no airflow round the lamp). */
  enclosed: boolean;
  dimmer: DimmerKind;
  location: MoistureRating;
  /** On an emergency or egress lighting circuit. */
  emergencyCircuit: boolean;
  /** Recessed fixture in contact with thermal insulation. */
  insulationContact: boolean;
  circuitVolts: number;
  /** Rating of the branch-circuit breaker in amps, when known. */
  breakerAmps?: number;
  /** Label of the branch circuit, to sum loads across entries (e.g. "Panel B / 14"). */
  circuitLabel?: string;
}

/** The proposed LED product: picked from the catalog (copied here) or typed in. */
export interface ProposedProduct {
  /** Catalog product id when picked from the catalog; the spec below is a copy. */
  catalogId?: string;
  name: string;
  form: ProductForm;
  tubeType: TubeType;
  /** How many of this product go in one fixture (tubes per troffer; 1 for luminaires). */
  unitsPerFixture: number;
  wattsPerUnit: number;
  lumensPerUnit: number;
  cctKelvin: number;
  cri: number;
  powerFactor: number;
  /** Lowest rated input voltage; absent when not recorded. */
  inputVoltsMin?: number;
  /** Highest rated input voltage; absent when not recorded. */
  inputVoltsMax?: number;
  dimmable: boolean;
  /** Rated by its maker for totally enclosed luminaires. */
  enclosedRated: boolean;
  moistureRating: MoistureRating;
  /** Rated for direct contact with insulation (IC-rated) — luminaires only. */
  insulationContactRated: boolean;
  /** Listed for emergency circuits or has an integral emergency driver. */
  emergencyListed: boolean;
  ratedLifeHours: number;
  distribution: Distribution;
  unitCost: number;
  /** Installer minutes per fixture. */
  installMinutesPerFixture: number;
  /** Rebate per fixture converted. */
  rebatePerFixture: number;
}

export interface FixtureEntry {
  id: string;
  /** Number of identical fixtures. */
  count: number;
  existing: ExistingEquipment;
  conditions: FixtureConditions;
  /** Null when this entry is logged but not (yet) being changed. */
  proposed: ProposedProduct | null;
  control: ControlChange;
  /** Overrides the control's default savings fraction (0–0.9). */
  controlSavingsFraction?: number;
  notes: string;
}

/** A product in the user's own catalog. */
export interface CatalogProduct extends Omit<ProposedProduct, 'catalogId'> {
  id: string;
  /** Example products seeded on first run are marked so. */
  example: boolean;
  retired: boolean;
  sku: string;
}

// ---------------------------------------------------------------------------
// Stored shapes (the survey store, `src/survey/store.ts`). Rooms and entries
// are stored flat, each with its parent's id and its place in the list; the
// nested `Survey` above is assembled from them (`src/survey/records.ts`).

/** A survey without its rooms: what survey lists show and what the store keeps per survey. */
export type SurveyHeader = Omit<Survey, 'rooms'>;

/** A room as stored: without its entries, with its survey and its place among that survey's rooms. */
export interface StoredRoom extends Omit<Room, 'entries'> {
  surveyId: string;
  /** Sort key among the survey's rooms (ascending; ties broken by id). */
  order: number;
}

/** A fixture entry as stored: with its room, its survey and its place among the room's entries. */
export interface StoredEntry extends FixtureEntry {
  roomId: string;
  surveyId: string;
  /** Sort key among the room's entries (ascending; ties broken by id). */
  order: number;
}

/** Image formats a photo (or its thumbnail) may be stored in. */
export type PhotoMimeType = 'image/jpeg' | 'image/png' | 'image/webp';

/** What a photo belongs to: a whole room or one fixture entry. */
export type PhotoOwnerKind = 'room' | 'entry';

/**
 * A photo taken on the walk. The screen that captures it downscales it and
 * makes the thumbnail; the store keeps both (thumbnails apart, so lists stay fast).
 */
export interface Photo {
  id: string;
  ownerKind: PhotoOwnerKind;
  /** Id of the room or fixture entry shown. */
  ownerId: string;
  surveyId: string;
  mimeType: PhotoMimeType;
  widthPixels: number;
  heightPixels: number;
  image: Blob;
  thumbnailMimeType: PhotoMimeType;
  thumbnail: Blob;
  /** ISO 8601 timestamp. */
  createdAt: string;
}

/** The small picture shown in lists, without the full image. */
export type PhotoThumbnail = Omit<Photo, 'image' | 'widthPixels' | 'heightPixels'>;

/** What a trash item holds. */
export type TrashKind = 'survey' | 'room' | 'entry' | 'photo' | 'portfolio';

/**
 * Something deleted, kept so it can be restored (for at least 30 days).
 * It holds every record that went with it: a deleted room keeps its entries
 * and the photos of both.
 */
export interface TrashItem {
  id: string;
  kind: TrashKind;
  /** Shown in the trash list: the survey, room or portfolio name, entry description, or "Photo". */
  label: string;
  /** ISO 8601 timestamp of the delete. */
  deletedAt: string;
  /** The survey it belongs to; the empty string for a portfolio (it belongs to none). */
  surveyId: string;
  /** Where it goes back: the survey of a room, the room of an entry, the owner of a photo; null for a survey or a portfolio. */
  parentId: string | null;
  /** The survey itself, for a deleted survey. */
  survey: SurveyHeader | null;
  rooms: StoredRoom[];
  entries: StoredEntry[];
  photos: Photo[];
  /**
   * The portfolio itself, for a deleted portfolio (its surveys are not in
   * the trash with it). Absent on every other item, and on items stored
   * before portfolios could be deleted to the trash.
   */
  portfolio?: Portfolio;
}

/** The answer to the browser's persistent-storage request. */
export interface PersistenceAnswer {
  /** ISO 8601 timestamp of the request. */
  requestedAt: string;
  /** True when granted, false when refused, null when this browser cannot be asked. */
  granted: boolean | null;
}

/** Facts about this installation that the store keeps beside the data. */
export interface AppSettings {
  /** Random id of this installation, also kept outside the database to detect eviction. */
  installId: string;
  /** ISO 8601 timestamps. */
  firstUsedAt: string;
  exampleCatalogSeededAt: string | null;
  demoSeededAt: string | null;
  persistence: PersistenceAnswer | null;
  lastBackupAt: string | null;
  /** Edits saved since the last full backup. */
  editsSinceBackup: number;
  lastEditAt: string | null;
}
