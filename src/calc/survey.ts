/**
 * The whole-survey calculation: every entry, every room and the totals the
 * client decides on, with all warnings. Screens call {@link calculateSurvey}
 * once when a survey opens and {@link recalculateEntry} on each edit (it
 * reuses every other entry's result, so a keystroke costs one entry, one room
 * and a re-sum, not the whole building).
 */
import type { FixtureEntry, ProposedProduct, Room, SpaceType, Survey } from '../survey/model.ts';
import { energyCostSavings, projectCost, relampCostPerYear, zeroCost, type ProjectCost } from './costs.ts';
import { analyseInvestment, simplePaybackYears, type InvestmentResult } from './economics.ts';
import {
  apparentPowerVoltAmperes,
  checkPowerFactor,
  currentAmps,
  kvaTotal,
  powerFactorDefault,
  sumCircuits,
  type CircuitLoad,
  type CircuitMember,
  type PowerFactorCheck,
} from './electrical.ts';
import { co2AvoidedKgPerYear, gridFactorSource, gridKgCo2PerKwh } from './emissions.ts';
import {
  annualHours,
  buildingOperatingDefaults,
  controlSavingsFraction,
  defaultHvacDemandFactor,
  energySavings,
  hvacInteractiveDefaults,
  kwhPerYear,
  operatingDefaultsSource,
  type EnergySavings,
  type SavingsFactors,
} from './energy.ts';
import {
  existingFixtureWatts,
  hasMercury,
  lastPcbBallastYear,
  typicalLampLifeHours,
  typicalExistingDistribution,
  typicalLuminaireEfficiency,
  type WattsBasis,
} from './equipment.ts';
import { CalcInputError, checkInteger, checkRange } from './errors.ts';
import {
  ballastFactorDefault,
  coefficientOfUtilisationForLuminaireLumens,
  defaultLumenBand,
  incandescentEquivalentLumens,
  judgeLumens,
  lampLumenDepreciationDefault,
  lightingPowerDensityWattsPerSquareMetre,
  lumenRatio,
  maintainedIlluminanceLux,
  roomCavityRatio,
  type LumenVerdict,
} from './lighting.ts';
import { lpdAllowanceWattsPerSquareMetre, spaceFacts, targetLux } from './spaces.ts';
import {
  displayUnits,
  toDisplay,
  luxToFootcandles,
  squareMetresToSquareFeet,
  wattsPerSquareMetreToWattsPerSquareFoot,
} from './units.ts';
import {
  circuitWarning,
  entryWarnings,
  roomWarnings,
  type EntryFacts,
  type Severity,
  type Warning,
} from './warnings.ts';

/** Figures for one side (existing or proposed) of an entry. */
export interface SideFigures {
  wattsPerFixture: number;
  /** All fixtures of the entry. */
  watts: number;
  hoursPerYear: number;
  kwhPerYear: number;
  /** Initial lumens leaving one fixture (lamp lumens × ballast factor × housing efficiency, or a luminaire's rated lumens); null when unknown. */
  lumensPerFixture: number | null;
  powerFactor: number;
  voltAmperes: number;
  amps: number;
}

export interface MoneyFigures {
  energyPerYear: number;
  demandPerYear: number;
  maintenancePerYear: number;
  /** First-year savings: energy + demand + maintenance. */
  totalPerYear: number;
  cost: ProjectCost;
  simplePaybackYears: number | null;
}

export interface EntryResult {
  entryId: string;
  roomId: string;
  count: number;
  description: string;
  proposedName: string | null;
  wattsBasis: WattsBasis;
  existing: SideFigures;
  proposed: SideFigures;
  controlSavingsFraction: number;
  savings: EnergySavings;
  money: MoneyFigures;
  co2KgPerYear: number;
  lumenRatio: number | null;
  lumenVerdict: LumenVerdict | null;
  powerFactorCheck: PowerFactorCheck | null;
  /** The branch circuit the entry is summed on, or null when none is recorded. */
  circuitLabel: string | null;
  warnings: Warning[];
}

export interface LoadTotals {
  watts: number;
  kwhPerYear: number;
  voltAmperes: number;
}

export interface Adequacy {
  floorSquareMetres: number;
  floorSquareFeet: number;
  roomCavityRatio: number;
  /** Coefficient of utilisation for lumens leaving the fixtures, lumen-weighted over the proposal (room override or table). */
  coefficientOfUtilisation: number;
  cuSource: 'room override' | 'table';
  targetLux: number;
  targetFootcandles: number;
  /** Maintained average illuminance by the lumen method; null when some lumens are unknown. */
  existingLux: number | null;
  proposedLux: number | null;
  existingFootcandles: number | null;
  proposedFootcandles: number | null;
  allowanceWattsPerSquareMetre: number;
  allowanceWattsPerSquareFoot: number;
  existingWattsPerSquareMetre: number;
  proposedWattsPerSquareMetre: number;
  existingWattsPerSquareFoot: number;
  proposedWattsPerSquareFoot: number;
  proposedWithinAllowance: boolean;
  /** Assumptions the figures rest on, in plain words. */
  notes: string[];
}

export interface RoomResult {
  roomId: string;
  name: string;
  spaceType: SpaceType;
  spaceLabel: string;
  hoursPerYear: number;
  /** Fixtures in the room (sum of entry counts). */
  fixtures: number;
  entries: EntryResult[];
  existing: LoadTotals;
  proposed: LoadTotals;
  savings: EnergySavings;
  money: MoneyFigures;
  co2KgPerYear: number;
  adequacy: Adequacy;
  /** Room-level warnings (entry warnings are on each entry). */
  warnings: Warning[];
  warningCounts: Record<Severity, number>;
}

export interface SurveyFactors extends SavingsFactors {
  kgCo2PerKwh: number;
  /** Where each default came from. */
  sources: { hvac: string; operating: string; grid: string };
}

export interface SurveyTotals {
  existing: LoadTotals & { kva: number };
  proposed: LoadTotals & { kva: number };
  savings: EnergySavings;
  money: MoneyFigures;
  co2KgPerYear: number;
  fixtures: number;
  entries: number;
  rooms: number;
}

export interface SurveyResult {
  surveyId: string;
  name: string;
  currency: string;
  units: Survey['units'];
  factors: SurveyFactors;
  totals: SurveyTotals;
  economics: InvestmentResult;
  rooms: RoomResult[];
  circuits: { existing: CircuitLoad[]; proposed: CircuitLoad[] };
  /** Every warning (entries, rooms, circuits), most serious first, in survey order within a severity. */
  warnings: Warning[];
  warningCounts: Record<Severity, number>;
}

/** Luminaire and room-surface dirt depreciation when a room gives none — from memory: typical "clean" room values used in lumen-method worked examples. */
export const defaultDirtDepreciation = { luminaire: 0.9, roomSurface: 0.95 } as const;

function countBySeverity(warnings: readonly Warning[], into: Record<Severity, number> = { danger: 0, caution: 0, advice: 0 }) {
  for (const w of warnings) into[w.severity] += 1;
  return into;
}

/** The survey-wide factors: user overrides win over published defaults. */
export function surveyFactors(survey: Survey): SurveyFactors {
  const hvac = hvacInteractiveDefaults(survey.buildingType, survey.heatingType);
  const operating = buildingOperatingDefaults[survey.buildingType];
  const s = survey.savings;
  const overridden = (v: number | undefined) => v !== undefined;
  return {
    hvacEnergyFactor: s.hvacEnergyFactor !== undefined ? checkRange('savings.hvacEnergyFactor', s.hvacEnergyFactor, 0, 3) : hvac.energyFactor,
    hvacDemandFactor: s.hvacDemandFactor !== undefined ? checkRange('savings.hvacDemandFactor', s.hvacDemandFactor, 0, 3) : defaultHvacDemandFactor,
    coincidenceFactor:
      s.coincidenceFactor !== undefined ? checkRange('savings.coincidenceFactor', s.coincidenceFactor, 0, 1) : operating.coincidenceFactor,
    gasThermsPerKwhSaved:
      s.gasThermsPerKwhSaved !== undefined ? checkRange('savings.gasThermsPerKwhSaved', s.gasThermsPerKwhSaved, -1, 1) : hvac.gasThermsPerKwh,
    kgCo2PerKwh: gridKgCo2PerKwh(survey.grid),
    sources: {
      hvac: overridden(s.hvacEnergyFactor) ? 'entered by the user' : hvac.source,
      operating: overridden(s.coincidenceFactor) ? 'entered by the user' : operatingDefaultsSource,
      grid: gridFactorSource(survey.grid),
    },
  };
}

/** Checks the survey's money assumptions that every money calculation uses. Shared with the automatic product choice. */
export function checkMoney(survey: Survey): void {
  const m = survey.money;
  checkRange('money.energyRatePerKwh', m.energyRatePerKwh, 0, 100);
  checkRange('money.demandChargePerKwMonth', m.demandChargePerKwMonth, 0, 10_000);
  checkRange('money.labourRatePerHour', m.labourRatePerHour, 0, 10_000);
  checkRange('money.markupFraction', m.markupFraction, 0, 5);
  checkRange('money.taxFraction', m.taxFraction, 0, 1);
  checkRange('money.lampRecyclingCostEach', m.lampRecyclingCostEach, 0, 1e6);
  checkRange('money.ballastDisposalCostEach', m.ballastDisposalCostEach, 0, 1e6);
  checkRange('money.relampMinutes', m.relampMinutes, 0, 600);
}

/** A room's floor as area and sides (an area alone is taken as a square). Shared with the automatic product choice. */
export function floorOf(room: Room): { squareMetres: number; lengthMetres: number; widthMetres: number; assumedSquare: boolean } {
  if (room.floor.kind === 'rectangle') {
    const l = checkRange('floor.lengthMetres', room.floor.lengthMetres, 1e-3, 1000);
    const w = checkRange('floor.widthMetres', room.floor.widthMetres, 1e-3, 1000);
    return { squareMetres: l * w, lengthMetres: l, widthMetres: w, assumedSquare: false };
  }
  const a = checkRange('floor.squareMetres', room.floor.squareMetres, 1e-6, 1e6);
  const side = Math.sqrt(a);
  return { squareMetres: a, lengthMetres: side, widthMetres: side, assumedSquare: true };
}

/** Per-room context shared by its entries. */
interface RoomContext {
  room: Room;
  hoursPerYear: number;
  occupancyFraction: number;
}

/**
 * Most watts one entry, or all the entries of one room, may draw: a bound
 * against typing errors (count × lamps × watts), far above any real lighting
 * load (common practice, no published source).
 */
const maxLoadWatts = 1e8;

function side(
  count: number,
  wattsPerFixture: number,
  hoursPerYear: number,
  lumensPerFixture: number | null,
  powerFactor: number,
  volts: number,
): SideFigures {
  const watts = count * wattsPerFixture;
  if (watts > maxLoadWatts) {
    throw new CalcInputError(
      'count',
      `${count} fixtures of ${wattsPerFixture} W draw ${watts} W together, more than the ${maxLoadWatts} W one entry may hold; check the count and the fixture's watts`,
    );
  }
  const voltAmperes = apparentPowerVoltAmperes(watts, powerFactor);
  return {
    wattsPerFixture,
    watts,
    hoursPerYear,
    kwhPerYear: kwhPerYear(count, wattsPerFixture, hoursPerYear),
    lumensPerFixture,
    powerFactor,
    voltAmperes,
    amps: currentAmps(voltAmperes, volts),
  };
}

/** Share of lamp light leaving the existing housing (entry value or typical). */
export function housingEfficiency(entry: FixtureEntry): number {
  const e = entry.existing;
  return e.luminaireEfficiency !== undefined
    ? checkRange('existing.luminaireEfficiency', e.luminaireEfficiency, 0.1, 1)
    : typicalLuminaireEfficiency[e.technology];
}

/** Initial lumens leaving one existing fixture: lamps × lamp lumens × ballast factor × housing efficiency; null when unknown. */
export function existingLumensPerFixture(entry: FixtureEntry): number | null {
  const e = entry.existing;
  const bf = e.ballastFactor !== undefined ? checkRange('existing.ballastFactor', e.ballastFactor, 0.3, 1.5) : ballastFactorDefault(e.ballast);
  let lampLumens: number;
  if (e.lumensPerLamp !== undefined) {
    lampLumens = checkRange('existing.lumensPerLamp', e.lumensPerLamp, 0, 1e7);
  } else if (e.technology === 'incandescent' || e.technology === 'halogen') {
    try {
      lampLumens = incandescentEquivalentLumens(e.ratedWattsPerLamp);
    } catch (err) {
      // Named by the entry's own field, so the user sees which value to change.
      if (!(err instanceof CalcInputError)) throw err;
      throw new CalcInputError(
        'existing.ratedWattsPerLamp',
        `${err.problem}: the light of an incandescent or halogen lamp is estimated from its watts only up to that; give the lamp's lumens instead`,
      );
    }
  } else {
    return null;
  }
  return e.lampsPerFixture * lampLumens * bf * housingEfficiency(entry);
}

/**
 * Initial lumens leaving one fixture after the swap: a luminaire or kit at its
 * rated lumens; lamps and tubes lose the existing housing's share.
 */
function proposedLumensPerFixture(entry: FixtureEntry, product: ProposedProduct, units: number, lumensPerUnit: number): number {
  const delivered = units * lumensPerUnit;
  return product.form === 'luminaire' || product.form === 'retrofit-kit' ? delivered : delivered * housingEfficiency(entry);
}

/** Ballast is taken out when the new product does not run on it. */
function removesBallast(entry: FixtureEntry): boolean {
  const p = entry.proposed;
  if (!p || entry.existing.ballast === 'none') return false;
  if (p.form === 'luminaire' || p.form === 'retrofit-kit') return true;
  return p.tubeType === 'type-b' || p.tubeType === 'type-c' || p.tubeType === 'type-a-b';
}

function calculateEntry(survey: Survey, factors: SurveyFactors, ctx: RoomContext, entry: FixtureEntry): EntryResult {
  const count = checkInteger('count', entry.count, 0, 100_000);
  const e = entry.existing;
  const p = entry.proposed;
  const c = entry.conditions;
  const volts = checkRange('conditions.circuitVolts', c.circuitVolts, 1, 1000);
  const existingWatts = existingFixtureWatts(e);
  const existingPf = e.powerFactor !== undefined ? checkRange('existing.powerFactor', e.powerFactor, 0.1, 1) : powerFactorDefault(e.technology, e.ballast);
  const existingLumens = existingLumensPerFixture(entry);
  const existing = side(count, existingWatts.wattsPerFixture, ctx.hoursPerYear, existingLumens, existingPf, volts);

  const controlFraction = controlSavingsFraction(entry.control, ctx.occupancyFraction, entry.controlSavingsFraction);
  const proposedHours = ctx.hoursPerYear * (1 - controlFraction);
  let proposed: SideFigures;
  let powerFactorCheck: PowerFactorCheck | null = null;
  if (p) {
    const units = checkInteger('proposed.unitsPerFixture', p.unitsPerFixture, 1, 24);
    const wattsPerUnit = checkRange('proposed.wattsPerUnit', p.wattsPerUnit, 0.01, 100_000);
    const lumensPerUnit = checkRange('proposed.lumensPerUnit', p.lumensPerUnit, 0, 1e7);
    powerFactorCheck = checkPowerFactor(p.powerFactor, wattsPerUnit, p.form);
    proposed = side(count, units * wattsPerUnit, proposedHours, proposedLumensPerFixture(entry, p, units, lumensPerUnit), p.powerFactor, volts);
  } else {
    proposed = side(count, existing.wattsPerFixture, proposedHours, existingLumens, existingPf, volts);
  }

  const savings = energySavings(existing, proposed, factors);
  const m = survey.money;
  const costs = energyCostSavings(savings.kwhPerYear, savings.peakKw, m.energyRatePerKwh, m.demandChargePerKwMonth);

  let cost = zeroCost;
  let maintenancePerYear = 0;
  if (p) {
    const lampsRemoved = count * e.lampsPerFixture;
    cost = projectCost(
      {
        materials: count * p.unitsPerFixture * checkRange('proposed.unitCost', p.unitCost, 0, 1e7),
        labour: count * (checkRange('proposed.installMinutesPerFixture', p.installMinutesPerFixture, 0, 6000) / 60) * m.labourRatePerHour,
        disposal:
          (hasMercury(e.technology) ? lampsRemoved * m.lampRecyclingCostEach : 0) +
          (removesBallast(entry) ? count * m.ballastDisposalCostEach : 0),
        rebates: count * checkRange('proposed.rebatePerFixture', p.rebatePerFixture, 0, 1e7),
      },
      m,
    );
    const existingLife = e.lampLifeHours !== undefined ? checkRange('existing.lampLifeHours', e.lampLifeHours, 1, 1e6) : typicalLampLifeHours[e.technology];
    const lampPrice = e.lampPrice !== undefined ? checkRange('existing.lampPrice', e.lampPrice, 0, 1e7) : 0;
    const before = relampCostPerYear(lampsRemoved, ctx.hoursPerYear, existingLife, lampPrice, m.relampMinutes, m.labourRatePerHour);
    const after = relampCostPerYear(
      count * p.unitsPerFixture,
      proposedHours,
      checkRange('proposed.ratedLifeHours', p.ratedLifeHours, 1, 1e6),
      p.unitCost,
      m.relampMinutes,
      m.labourRatePerHour,
    );
    maintenancePerYear = before - after;
  }
  const totalPerYear = costs.energy + costs.demand + maintenancePerYear;
  const ratio = p && existingLumens !== null && proposed.lumensPerFixture !== null ? lumenRatio(proposed.lumensPerFixture, existingLumens) : null;

  const ratedFixtureWatts = existingWatts.ratedFixtureWatts;
  const facts: EntryFacts = {
    lumenRatio: ratio,
    lumenBand: defaultLumenBand,
    ratedFixtureWatts,
    meteredWattsPerFixture: e.meteredWattsPerFixture ?? null,
    wattsEstimated: existingWatts.basis === 'estimated',
    existingWattsPerFixture: existing.wattsPerFixture,
    proposedWattsPerFixture: p ? proposed.wattsPerFixture : null,
    powerFactorFailure: powerFactorCheck && !powerFactorCheck.passes ? { minimum: powerFactorCheck.minimum, rule: powerFactorCheck.source } : null,
    hasMercury: hasMercury(e.technology),
    pcbRisk:
      e.ballast !== 'magnetic' || !hasMercury(e.technology)
        ? 'none'
        : e.ballastYear === undefined
          ? 'unknown'
          : e.ballastYear <= lastPcbBallastYear
            ? 'likely'
            : 'none',
  };

  return {
    entryId: entry.id,
    roomId: ctx.room.id,
    count,
    description: e.description,
    proposedName: p ? p.name : null,
    wattsBasis: existingWatts.basis,
    existing,
    proposed,
    controlSavingsFraction: controlFraction,
    savings,
    money: {
      energyPerYear: costs.energy,
      demandPerYear: costs.demand,
      maintenancePerYear,
      totalPerYear,
      cost,
      simplePaybackYears: simplePaybackYears(cost.net, totalPerYear),
    },
    co2KgPerYear: co2AvoidedKgPerYear(savings.kwhPerYear, factors.kgCo2PerKwh),
    lumenRatio: ratio,
    lumenVerdict: ratio === null ? null : judgeLumens(ratio, defaultLumenBand),
    powerFactorCheck,
    circuitLabel: circuitOf(ctx.room, entry),
    warnings: entryWarnings(ctx.room, entry, facts),
  };
}

function roomContext(room: Room): RoomContext {
  const facts = spaceFacts[room.spaceType];
  if (!facts) throw new RangeError(`unknown space type "${String(room.spaceType)}"`);
  return { room, hoursPerYear: annualHours(room.hours), occupancyFraction: facts.occupancySensorSavingsFraction };
}

function sumLoads(items: readonly Record<'existing' | 'proposed', LoadTotals>[], which: 'existing' | 'proposed'): LoadTotals {
  let watts = 0;
  let kwh = 0;
  let va = 0;
  for (const item of items) {
    const s = item[which];
    watts += s.watts;
    kwh += s.kwhPerYear;
    va += s.voltAmperes;
  }
  return { watts, kwhPerYear: kwh, voltAmperes: va };
}

/** Savings, CO2, fixtures and warning counts summed over entries (into a room) or rooms (into the survey). */
function sumOutcomes(
  items: readonly { savings: EnergySavings; co2KgPerYear: number }[],
  fixturesOf: (index: number) => number,
): { savings: EnergySavings; co2KgPerYear: number; fixtures: number } {
  let lightingKwh = 0;
  let kwh = 0;
  let connectedKw = 0;
  let peakKw = 0;
  let gas = 0;
  let co2 = 0;
  let fixtures = 0;
  for (let i = 0; i < items.length; i++) {
    const { savings, co2KgPerYear } = items[i]!;
    lightingKwh += savings.lightingKwhPerYear;
    kwh += savings.kwhPerYear;
    connectedKw += savings.connectedKw;
    peakKw += savings.peakKw;
    gas += savings.gasThermsPerYear;
    co2 += co2KgPerYear;
    fixtures += fixturesOf(i);
  }
  return {
    savings: { lightingKwhPerYear: lightingKwh, kwhPerYear: kwh, connectedKw, peakKw, gasThermsPerYear: gas },
    co2KgPerYear: co2,
    fixtures,
  };
}

function sumMoney(items: readonly { money: MoneyFigures }[]): MoneyFigures {
  let energy = 0;
  let demand = 0;
  let maintenance = 0;
  let materials = 0;
  let labour = 0;
  let disposal = 0;
  let markup = 0;
  let tax = 0;
  let gross = 0;
  let rebates = 0;
  let net = 0;
  for (const { money } of items) {
    energy += money.energyPerYear;
    demand += money.demandPerYear;
    maintenance += money.maintenancePerYear;
    const c = money.cost;
    materials += c.materials;
    labour += c.labour;
    disposal += c.disposal;
    markup += c.markup;
    tax += c.tax;
    gross += c.gross;
    rebates += c.rebates;
    net += c.net;
  }
  return moneyFigures(energy, demand, maintenance, { materials, labour, disposal, markup, tax, gross, rebates, net });
}

/**
 * Money figures from the yearly savings and the project cost: their total
 * and the simple payback on the net cost.
 *
 * @example moneyFigures(300, 50, 50, { ...zeroCost, gross: 1200, net: 1200 }).simplePaybackYears //=> 3
 */
export function moneyFigures(energyPerYear: number, demandPerYear: number, maintenancePerYear: number, cost: ProjectCost): MoneyFigures {
  const total = energyPerYear + demandPerYear + maintenancePerYear;
  return {
    energyPerYear,
    demandPerYear,
    maintenancePerYear,
    totalPerYear: total,
    cost,
    simplePaybackYears: simplePaybackYears(cost.net, total),
  };
}

/**
 * Maintained average illuminance by the lumen method, summing each entry's
 * fixtures: lumens leaving the fixture × CU for luminaire lumens (by the
 * entry's distribution, or the room's CU override) × LLD × LDD × RSDD over the
 * floor area. Null when any fixture's lumens are unknown.
 */
function illuminance(
  room: Room,
  entries: readonly FixtureEntry[],
  results: readonly EntryResult[],
  which: 'existing' | 'proposed',
  rcr: number,
  floorSquareMetres: number,
): { lux: number; meanCu: number } | null {
  const ph = room.photometry;
  const ldd = ph.luminaireDirtDepreciation ?? defaultDirtDepreciation.luminaire;
  const rsdd = ph.roomSurfaceDirtDepreciation ?? defaultDirtDepreciation.roomSurface;
  const cuOverride = ph.coefficientOfUtilisation;
  let utilised = 0;
  let emitted = 0;
  let cuWeighted = 0;
  for (let i = 0; i < results.length; i++) {
    const r = results[i]!;
    const entry = entries[i]!;
    const s = r[which];
    if (r.count === 0) continue;
    if (s.lumensPerFixture === null) return null;
    const isNew = which === 'proposed' && entry.proposed !== null;
    const distribution = isNew ? entry.proposed!.distribution : typicalExistingDistribution[entry.existing.technology];
    const cu = cuOverride ?? coefficientOfUtilisationForLuminaireLumens(distribution, rcr);
    let llf: number;
    if (ph.lightLossFactor !== undefined) {
      // The user's total LLF includes the ballast factor, which lumensPerFixture already carries.
      const bf = isNew ? 1 : (entry.existing.ballastFactor ?? ballastFactorDefault(entry.existing.ballast));
      llf = ph.lightLossFactor / bf;
    } else {
      llf = lampLumenDepreciationDefault(isNew ? 'led' : entry.existing.technology) * ldd * rsdd;
    }
    const lumens = r.count * s.lumensPerFixture;
    emitted += lumens;
    cuWeighted += lumens * cu;
    utilised += lumens * cu * llf;
  }
  return { lux: maintainedIlluminanceLux(utilised, 1, 1, floorSquareMetres), meanCu: emitted > 0 ? cuWeighted / emitted : 0 };
}

function calculateRoom(survey: Survey, factors: SurveyFactors, room: Room, entryResults?: EntryResult[]): RoomResult {
  const ctx = roomContext(room);
  const entries = entryResults ?? calculateEntries(survey, factors, ctx);
  const floor = floorOf(room);
  const ceiling = checkRange('ceilingHeightMetres', room.ceilingHeightMetres, 0.1, 100);
  const workPlane = checkRange('workPlaneHeightMetres', room.workPlaneHeightMetres, 0, 100);
  const cavity = Math.max(ceiling - workPlane, 0.01);
  const rcr = roomCavityRatio(floor.lengthMetres, floor.widthMetres, cavity);
  const override = room.photometry.coefficientOfUtilisation;
  if (override !== undefined) checkRange('photometry.coefficientOfUtilisation', override, 0.01, 1.5);
  if (room.photometry.lightLossFactor !== undefined) checkRange('photometry.lightLossFactor', room.photometry.lightLossFactor, 0.01, 1.5);
  const existingLoads = sumLoads(entries, 'existing');
  const proposedLoads = sumLoads(entries, 'proposed');
  const existingLight = illuminance(room, room.entries, entries, 'existing', rcr, floor.squareMetres);
  const proposedLight = illuminance(room, room.entries, entries, 'proposed', rcr, floor.squareMetres);
  const existingLux = existingLight?.lux ?? null;
  const proposedLux = proposedLight?.lux ?? null;
  const target = targetLux(room.spaceType);
  const allowance = lpdAllowanceWattsPerSquareMetre(room.spaceType);
  const roomWatts = Math.max(existingLoads.watts, proposedLoads.watts);
  if (roomWatts > maxLoadWatts) {
    throw new CalcInputError('entries', `the fixtures draw ${roomWatts} W together, more than the ${maxLoadWatts} W one room may hold; check their counts and watts`);
  }
  const existingLpd = lightingPowerDensityWattsPerSquareMetre(existingLoads.watts, floor.squareMetres);
  const proposedLpd = lightingPowerDensityWattsPerSquareMetre(proposedLoads.watts, floor.squareMetres);
  const notes: string[] = [
    `Lumen method with fixtures at the ceiling: cavity ${toDisplay('length', cavity, survey.units).toFixed(2)} ${displayUnits.length[survey.units]} from work plane to ceiling.`,
    override !== undefined
      ? 'Coefficient of utilisation entered for this room.'
      : "Coefficients of utilisation from the table for each fixture's distribution at 80/50/20 % reflectances, taken to the lumens leaving the fixture (an estimate; the product's own photometry is better).",
  ];
  if (floor.assumedSquare) notes.push('Only the floor area is known: the room is taken as square for the cavity ratio.');
  if (existingLux === null) notes.push('Existing illuminance not estimated: lumens are unknown for some existing fixtures.');

  const proposedCcts = room.entries.flatMap((e) => (e.proposed && e.count > 0 ? [e.proposed.cctKelvin] : []));
  const hasProposal = room.entries.some((e) => e.proposed !== null && e.count > 0);
  const warnings = roomWarnings(room, {
    proposedCctsKelvin: proposedCcts,
    proposedLux,
    targetLux: target,
    proposedWattsPerSquareMetre: proposedLpd,
    allowanceWattsPerSquareMetre: allowance,
    hasProposal,
  }, survey.units);
  const { savings, co2KgPerYear: co2, fixtures } = sumOutcomes(entries, (i) => entries[i]!.count);
  const counts = countBySeverity(warnings);
  for (const r of entries) countBySeverity(r.warnings, counts);
  return {
    roomId: room.id,
    name: room.name,
    spaceType: room.spaceType,
    spaceLabel: spaceFacts[room.spaceType].label,
    hoursPerYear: ctx.hoursPerYear,
    fixtures,
    entries,
    existing: existingLoads,
    proposed: proposedLoads,
    savings,
    money: sumMoney(entries),
    co2KgPerYear: co2,
    adequacy: {
      floorSquareMetres: floor.squareMetres,
      floorSquareFeet: squareMetresToSquareFeet(floor.squareMetres),
      roomCavityRatio: rcr,
      coefficientOfUtilisation: proposedLight?.meanCu ?? existingLight?.meanCu ?? 0,
      cuSource: override !== undefined ? 'room override' : 'table',
      targetLux: target,
      targetFootcandles: luxToFootcandles(target),
      existingLux,
      proposedLux,
      existingFootcandles: existingLux === null ? null : luxToFootcandles(existingLux),
      proposedFootcandles: proposedLux === null ? null : luxToFootcandles(proposedLux),
      allowanceWattsPerSquareMetre: allowance,
      allowanceWattsPerSquareFoot: wattsPerSquareMetreToWattsPerSquareFoot(allowance),
      existingWattsPerSquareMetre: existingLpd,
      proposedWattsPerSquareMetre: proposedLpd,
      existingWattsPerSquareFoot: wattsPerSquareMetreToWattsPerSquareFoot(existingLpd),
      proposedWattsPerSquareFoot: wattsPerSquareMetreToWattsPerSquareFoot(proposedLpd),
      proposedWithinAllowance: proposedLpd <= allowance,
      notes,
    },
    warnings,
    warningCounts: counts,
  };
}

/** Re-throws a calculation input error with the path of the record it came from. */
function withField<T>(prefix: string, run: () => T): T {
  try {
    return run();
  } catch (err) {
    throw prefixed(prefix, err);
  }
}

function prefixed(prefix: string, err: unknown): unknown {
  return err instanceof CalcInputError ? new CalcInputError(`${prefix}.${err.field}`, err.problem) : err;
}

function calculateEntries(survey: Survey, factors: SurveyFactors, ctx: RoomContext): EntryResult[] {
  const list = ctx.room.entries;
  const out: EntryResult[] = new Array<EntryResult>(list.length);
  for (let i = 0; i < list.length; i++) {
    try {
      out[i] = calculateEntry(survey, factors, ctx, list[i]!);
    } catch (err) {
      throw prefixed(`entries[${i}]`, err);
    }
  }
  return out;
}

/** The circuit an entry is summed on: its label, or its own circuit when only a breaker is given. */
function circuitOf(room: Room, entry: FixtureEntry): string | null {
  const c = entry.conditions;
  if (c.circuitLabel !== undefined) return c.circuitLabel.trim();
  if (c.breakerAmps !== undefined) return `${room.name}: ${entry.existing.description || entry.id}`.trim();
  return null;
}

const labelOrder = new Intl.Collator('en', { numeric: true });

/** Sums every circuit, sorted by label. */
function circuitLoads(survey: Survey, rooms: readonly RoomResult[]): SurveyResult['circuits'] {
  const existing: CircuitMember[] = [];
  const proposed: CircuitMember[] = [];
  for (let ri = 0; ri < survey.rooms.length; ri++) {
    const room = survey.rooms[ri]!;
    const rr = rooms[ri]!;
    for (let ei = 0; ei < room.entries.length; ei++) {
      const r = rr.entries[ei]!;
      const label = r.circuitLabel;
      if (label === null) continue;
      const entry = room.entries[ei]!;
      const volts = entry.conditions.circuitVolts;
      const breakerAmps = entry.conditions.breakerAmps ?? null;
      existing.push({ circuitLabel: label, volts, breakerAmps, watts: r.existing.watts, powerFactor: r.existing.powerFactor });
      proposed.push({ circuitLabel: label, volts, breakerAmps, watts: r.proposed.watts, powerFactor: r.proposed.powerFactor });
    }
  }
  const byLabel = (a: CircuitLoad, b: CircuitLoad) => labelOrder.compare(a.circuitLabel, b.circuitLabel);
  return { existing: sumCircuits(existing).sort(byLabel), proposed: sumCircuits(proposed).sort(byLabel) };
}

/** Replaces the named circuits in `previous` with `fresh` ones, keeping label order. */
function mergeCircuits(previous: readonly CircuitLoad[], fresh: readonly CircuitLoad[], labels: ReadonlySet<string>): CircuitLoad[] {
  const kept = previous.filter((c) => !labels.has(c.circuitLabel));
  return [...kept, ...fresh].sort((a, b) => labelOrder.compare(a.circuitLabel, b.circuitLabel));
}

/** The warning of each overloaded circuit, kept per circuit result so unchanged circuits reuse theirs. */
const circuitWarningOf = new WeakMap<CircuitLoad, Warning>();

function circuitWarnings(circuits: SurveyResult['circuits']): Warning[] {
  const out: Warning[] = [];
  for (const which of ['existing', 'proposed'] as const) {
    for (const c of circuits[which]) {
      if (!c.overContinuousLimit || c.breakerAmps === null) continue;
      let w = circuitWarningOf.get(c);
      if (!w) {
        w = circuitWarning(c.circuitLabel, c.amps, c.breakerAmps, which);
        circuitWarningOf.set(c, w);
      }
      out.push(w);
    }
  }
  return out;
}

/** Every warning, most serious first, in survey order within a severity. */
function collectWarnings(rooms: readonly RoomResult[], circuitList: readonly Warning[]): Warning[] {
  const buckets: Record<Severity, Warning[]> = { danger: [], caution: [], advice: [] };
  for (const r of rooms) {
    for (const e of r.entries) for (const w of e.warnings) buckets[w.severity].push(w);
    for (const w of r.warnings) buckets[w.severity].push(w);
  }
  for (const w of circuitList) buckets[w.severity].push(w);
  const all = buckets.danger;
  for (const w of buckets.caution) all.push(w);
  for (const w of buckets.advice) all.push(w);
  return all;
}

function assemble(survey: Survey, factors: SurveyFactors, rooms: RoomResult[], circuits: SurveyResult['circuits']): SurveyResult {
  const existing = sumLoads(rooms, 'existing');
  const proposed = sumLoads(rooms, 'proposed');
  const { savings, co2KgPerYear: co2, fixtures } = sumOutcomes(rooms, (i) => rooms[i]!.fixtures);
  let entryCount = 0;
  const counts: Record<Severity, number> = { danger: 0, caution: 0, advice: 0 };
  for (const r of rooms) {
    entryCount += r.entries.length;
    counts.danger += r.warningCounts.danger;
    counts.caution += r.warningCounts.caution;
    counts.advice += r.warningCounts.advice;
  }
  const circuitList = circuitWarnings(circuits);
  countBySeverity(circuitList, counts);
  const money = sumMoney(rooms);
  const m = survey.money;
  const economics = analyseInvestment({
    netInvestment: money.cost.net,
    energySavingsFirstYear: money.energyPerYear,
    demandSavingsFirstYear: money.demandPerYear,
    maintenanceSavingsPerYear: money.maintenancePerYear,
    energyEscalationPerYear: m.energyEscalationPerYear,
    discountRatePerYear: m.discountRatePerYear,
    analysisYears: m.analysisYears,
  });
  const result: Omit<SurveyResult, 'warnings'> = {
    surveyId: survey.id,
    name: survey.name,
    currency: m.currency,
    units: survey.units,
    factors,
    totals: {
      existing: { ...existing, kva: kvaTotal(existing.voltAmperes) },
      proposed: { ...proposed, kva: kvaTotal(proposed.voltAmperes) },
      savings,
      money,
      co2KgPerYear: co2,
      fixtures,
      entries: entryCount,
      rooms: rooms.length,
    },
    economics,
    rooms,
    circuits,
    warningCounts: counts,
  };
  // The full list is built on first read (a screen reads counts on each keystroke, the list only when shown).
  let list: Warning[] | null = null;
  Object.defineProperty(result, 'warnings', {
    enumerable: true,
    get: () => (list ??= collectWarnings(rooms, circuitList)),
  });
  return result as SurveyResult;
}

/**
 * Calculates everything for a survey. Throws a `CalcInputError` whose
 * `field` names the room and entry (`rooms[0].entries[2].count`) when an
 * input is out of range.
 *
 * @example calculateSurvey(demoSurvey()).totals.fixtures //=> 40
 */
export function calculateSurvey(survey: Survey): SurveyResult {
  checkMoney(survey);
  const factors = surveyFactors(survey);
  const rooms = new Array<RoomResult>(survey.rooms.length);
  for (let i = 0; i < survey.rooms.length; i++) {
    try {
      rooms[i] = calculateRoom(survey, factors, survey.rooms[i]!);
    } catch (err) {
      throw prefixed(`rooms[${i}]`, err);
    }
  }
  return assemble(survey, factors, rooms, circuitLoads(survey, rooms));
}

/**
 * Lookup tables carried from one result to the next by recalculateEntry, so a
 * keystroke does not rebuild them: where each entry sits, and which entries
 * are on each circuit.
 */
interface ResultIndex {
  positions: Map<string, readonly [number, number]>;
  circuitMembers: Map<string, (readonly [number, number])[]>;
}

const indexes = new WeakMap<SurveyResult, ResultIndex>();

function indexOf(result: SurveyResult): ResultIndex {
  let index = indexes.get(result);
  if (!index) {
    const positions = new Map<string, readonly [number, number]>();
    const circuitMembers = new Map<string, (readonly [number, number])[]>();
    result.rooms.forEach((r, ri) =>
      r.entries.forEach((e, ei) => {
        const at = [ri, ei] as const;
        positions.set(e.entryId, at);
        if (e.circuitLabel !== null) {
          const list = circuitMembers.get(e.circuitLabel);
          if (list) list.push(at);
          else circuitMembers.set(e.circuitLabel, [at]);
        }
      }),
    );
    index = { positions, circuitMembers };
    indexes.set(result, index);
  }
  return index;
}

function findEntry(index: ResultIndex, survey: Survey, entryId: string): readonly [number, number] | null {
  const known = index.positions.get(entryId);
  if (known && survey.rooms[known[0]]?.entries[known[1]]?.id === entryId) return known;
  // New or moved: search the survey itself.
  for (let ri = 0; ri < survey.rooms.length; ri++) {
    const ei = survey.rooms[ri]!.entries.findIndex((e) => e.id === entryId);
    if (ei >= 0) return [ri, ei];
  }
  return null;
}

/** Sums the named circuits from their members' results. */
function circuitLoadsOf(
  survey: Survey,
  rooms: readonly RoomResult[],
  members: ReadonlyMap<string, readonly (readonly [number, number])[]>,
  labels: ReadonlySet<string>,
): SurveyResult['circuits'] {
  const existing: CircuitMember[] = [];
  const proposed: CircuitMember[] = [];
  for (const label of labels) {
    for (const [ri, ei] of members.get(label) ?? []) {
      const r = rooms[ri]!.entries[ei]!;
      const c = survey.rooms[ri]!.entries[ei]!.conditions;
      const breakerAmps = c.breakerAmps ?? null;
      existing.push({ circuitLabel: label, volts: c.circuitVolts, breakerAmps, watts: r.existing.watts, powerFactor: r.existing.powerFactor });
      proposed.push({ circuitLabel: label, volts: c.circuitVolts, breakerAmps, watts: r.proposed.watts, powerFactor: r.proposed.powerFactor });
    }
  }
  return { existing: sumCircuits(existing), proposed: sumCircuits(proposed) };
}

/**
 * Recalculates after one entry changed (or was appended to its room) in
 * `survey`, reusing every other entry's result from `previous`. The
 * survey-level assumptions must be unchanged since `previous` (otherwise call
 * {@link calculateSurvey}); when rooms were added, removed or reordered it
 * falls back to a full calculation. Returns a new result; `previous` is not
 * modified.
 *
 * @example recalculateEntry(previous, surveyWithEditedEntry, 'entry-12').totals.savings.kwhPerYear
 */
export function recalculateEntry(previous: SurveyResult, survey: Survey, entryId: string): SurveyResult {
  const index = indexOf(previous);
  const at = findEntry(index, survey, entryId);
  if (!at) throw new RangeError(`entry "${entryId}" is not in the survey`);
  const [roomIndex, entryIndex] = at;
  const room = survey.rooms[roomIndex]!;
  const prevRoom = previous.rooms[roomIndex];
  if (!prevRoom || prevRoom.roomId !== room.id || previous.rooms.length !== survey.rooms.length) return calculateSurvey(survey);
  const ctx = roomContext(room);
  const entry = room.entries[entryIndex]!;
  const newEntry = withField(`rooms[${roomIndex}].entries[${entryIndex}]`, () => calculateEntry(survey, previous.factors, ctx, entry));
  const prevEntries = prevRoom.entries;
  let entryResults: EntryResult[];
  let oldEntry: EntryResult | undefined;
  if (prevEntries.length === room.entries.length && prevEntries[entryIndex]?.entryId === entryId) {
    oldEntry = prevEntries[entryIndex];
    entryResults = prevEntries.slice();
    entryResults[entryIndex] = newEntry;
  } else if (prevEntries.length + 1 === room.entries.length && entryIndex === room.entries.length - 1) {
    entryResults = [...prevEntries, newEntry];
  } else {
    return calculateSurvey(survey);
  }
  const newRoom = withField(`rooms[${roomIndex}]`, () => calculateRoom(survey, previous.factors, room, entryResults));
  const rooms = previous.rooms.slice();
  rooms[roomIndex] = newRoom;
  // Carry the lookup tables forward, changing only what this entry changed.
  const appended = oldEntry === undefined;
  let positions = index.positions;
  if (appended) {
    positions = new Map(positions);
    positions.set(entryId, at);
  }
  let circuitMembers = index.circuitMembers;
  const oldLabel = oldEntry?.circuitLabel ?? null;
  const newLabel = newEntry.circuitLabel;
  if (oldLabel !== newLabel) {
    circuitMembers = new Map(circuitMembers);
    if (oldLabel !== null) {
      const rest = (circuitMembers.get(oldLabel) ?? []).filter(([ri, ei]) => ri !== roomIndex || ei !== entryIndex);
      if (rest.length > 0) circuitMembers.set(oldLabel, rest);
      else circuitMembers.delete(oldLabel);
    }
    if (newLabel !== null) {
      const list = [...(circuitMembers.get(newLabel) ?? []), at].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
      circuitMembers.set(newLabel, list);
    }
  }
  // Re-sum only the circuits this entry was or is on.
  const labels = new Set<string>();
  if (oldLabel !== null) labels.add(oldLabel);
  if (newLabel !== null) labels.add(newLabel);
  let circuits = previous.circuits;
  if (labels.size > 0) {
    const fresh = circuitLoadsOf(survey, rooms, circuitMembers, labels);
    circuits = {
      existing: mergeCircuits(previous.circuits.existing, fresh.existing, labels),
      proposed: mergeCircuits(previous.circuits.proposed, fresh.proposed, labels),
    };
  }
  const result = assemble(survey, previous.factors, rooms, circuits);
  indexes.set(result, { positions, circuitMembers });
  return result;
}
