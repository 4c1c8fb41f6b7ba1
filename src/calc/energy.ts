/**
 * Energy and demand: hours of use, control savings, connected load, annual
 * kWh, and savings by the US DOE Uniform Methods Project lighting protocol
 * (UMP Ch. 2, "Commercial and Industrial Lighting Evaluation Protocol",
 * NREL/SR-7A40-68558, 2017):
 *
 *   ΔkWh = Σ [(N·kW)_base × HOU_base − (N·kW)_post × HOU_post] × (1 + HVAC_c)
 *   ΔkW  = Σ [(N·kW)_base − (N·kW)_post] × CF × (1 + HVAC_d)
 *
 * State technical reference manuals write the same with a waste-heat factor
 * (WHF) in place of (1 + HVAC). The in-service rate is taken as 1 (the
 * auditor logs installed equipment).
 */
import type { BuildingType, ControlChange, HeatingType, HoursOfUse } from '../survey/model.ts';
import { checkRange } from './errors.ts';
import { hoursInYear, weeksPerYear } from './units.ts';

/**
 * Annual burn hours from an annual figure or a weekly schedule.
 *
 * @example annualHours({ kind: 'weekly', days: [10, 10, 10, 10, 10, 0, 0] }) //=> 2607.1…
 */
export function annualHours(hours: HoursOfUse, field = 'hours'): number {
  if (hours.kind === 'annual') return checkRange(`${field}.hoursPerYear`, hours.hoursPerYear, 0, hoursInYear);
  let perWeek = 0;
  hours.days.forEach((h, i) => {
    perWeek += checkRange(`${field}.days[${i}]`, h, 0, 24);
  });
  const weeks = hours.weeksPerYear === undefined ? weeksPerYear : checkRange(`${field}.weeksPerYear`, hours.weeksPerYear, 1, 53);
  return Math.min(perWeek * weeks, hoursInYear);
}

/**
 * Default savings fractions for control changes other than occupancy
 * sensors (those come from the space type, ASHRAE/IES 90.1-2019 Table G3.7).
 * From memory: typical program-evaluation figures for daylight dimming in a
 * sidelit zone and for scheduled time switches; override per entry.
 */
export const controlSavingsDefaults = {
  'daylight-dimming': 0.25,
  timer: 0.1,
} as const;

/**
 * The fraction of burn hours a control change removes.
 * Occupancy and vacancy sensors use the space type's Table G3.7 fraction
 * (a vacancy sensor is given the same credit; it saves at least as much).
 *
 * @example controlSavingsFraction('occupancy-sensor', 0.3) //=> 0.3
 */
export function controlSavingsFraction(control: ControlChange, occupancyFractionForSpace: number, override?: number): number {
  if (override !== undefined) return checkRange('controlSavingsFraction', override, 0, 0.9);
  switch (control) {
    case 'none':
      return 0;
    case 'occupancy-sensor':
    case 'vacancy-sensor':
      return occupancyFractionForSpace;
    case 'daylight-dimming':
    case 'timer':
      return controlSavingsDefaults[control];
  }
}

/**
 * Annual energy of `count` fixtures at `wattsPerFixture` burning `hoursPerYear`.
 *
 * @example kwhPerYear(10, 113, 3000) //=> 3390
 */
export function kwhPerYear(count: number, wattsPerFixture: number, hoursPerYear: number): number {
  return (count * wattsPerFixture * hoursPerYear) / 1000;
}

/**
 * Lighting-savings yield (1 + HVAC_c) by building and heating type, from
 * Bonneville Power Administration, "HVAC Interactive Effects" (2012).
 * Columns: electric resistance, heat pump, gas/oil, refrigerated.
 * `gasThermsPerKwh` is BPA's gas heating penalty per kWh of lighting saved
 * (applies only with fossil heating).
 */
const bpaInteractive: Partial<
  Record<BuildingType, { resistance: number; heatPump: number; fossil: number; refrigerated: number; gasThermsPerKwh: number }>
> = {
  'office-large': { resistance: 0.92, heatPump: 1.02, fossil: 1.08, refrigerated: 1.3, gasThermsPerKwh: -0.00819 },
  'office-small': { resistance: 0.69, heatPump: 0.96, fossil: 1.12, refrigerated: 1.3, gasThermsPerKwh: -0.02138 },
  school: { resistance: 0.57, heatPump: 0.86, fossil: 1.0, refrigerated: 1.3, gasThermsPerKwh: -0.02184 },
  retail: { resistance: 0.68, heatPump: 0.93, fossil: 1.03, refrigerated: 1.3, gasThermsPerKwh: -0.01774 },
  warehouse: { resistance: 0.61, heatPump: 0.81, fossil: 0.96, refrigerated: 1.3, gasThermsPerKwh: -0.01774 },
  restaurant: { resistance: 0.43, heatPump: 0.73, fossil: 0.96, refrigerated: 1.3, gasThermsPerKwh: -0.02684 },
  hospital: { resistance: 0.29, heatPump: 0.65, fossil: 0.94, refrigerated: 1.3, gasThermsPerKwh: -0.03276 },
  exterior: { resistance: 1.0, heatPump: 1.0, fossil: 1.0, refrigerated: 1.3, gasThermsPerKwh: 0 },
};

export const bpaSource = 'Bonneville Power Administration, "HVAC Interactive Effects" (2012)';

export interface InteractiveDefaults {
  /** 1 + HVAC_c */
  energyFactor: number;
  /** Therms of gas per kWh of lighting saved (negative: more gas burned). */
  gasThermsPerKwh: number;
  source: string;
}

/**
 * The published HVAC interactive energy factor and gas penalty for a building
 * and heating type. Building types the BPA table has no row for
 * (multifamily, other) and unconditioned spaces get 1.0 and no gas penalty,
 * and the source says so.
 *
 * @example hvacInteractiveDefaults('office-small', 'fossil') //=> { energyFactor: 1.12, gasThermsPerKwh: -0.02138, … }
 */
export function hvacInteractiveDefaults(building: BuildingType, heating: HeatingType): InteractiveDefaults {
  const row = bpaInteractive[building];
  if (heating === 'unconditioned') {
    return { energyFactor: 1, gasThermsPerKwh: 0, source: 'unconditioned space: no HVAC interaction' };
  }
  if (!row) {
    return {
      energyFactor: 1,
      gasThermsPerKwh: 0,
      source: `no row for this building type in ${bpaSource}; 1.0 assumed, enter your own factor`,
    };
  }
  switch (heating) {
    case 'electric-resistance':
      return { energyFactor: row.resistance, gasThermsPerKwh: 0, source: bpaSource };
    case 'heat-pump':
      return { energyFactor: row.heatPump, gasThermsPerKwh: 0, source: bpaSource };
    case 'fossil':
      return { energyFactor: row.fossil, gasThermsPerKwh: row.gasThermsPerKwh, source: bpaSource };
    case 'refrigerated':
      return { energyFactor: row.refrigerated, gasThermsPerKwh: 0, source: bpaSource };
  }
}

/**
 * Default annual lighting hours and peak coincidence factor by building type.
 * From memory: values typical of US state technical reference manuals for
 * interior lighting; no TRM was read for these figures. Override them with
 * your program's TRM or, better, with logged hours.
 */
export const buildingOperatingDefaults: Readonly<Record<BuildingType, { hoursPerYear: number; coincidenceFactor: number }>> = {
  'office-large': { hoursPerYear: 3_500, coincidenceFactor: 0.7 },
  'office-small': { hoursPerYear: 3_000, coincidenceFactor: 0.7 },
  school: { hoursPerYear: 2_300, coincidenceFactor: 0.45 },
  retail: { hoursPerYear: 4_100, coincidenceFactor: 0.9 },
  warehouse: { hoursPerYear: 3_600, coincidenceFactor: 0.75 },
  restaurant: { hoursPerYear: 4_200, coincidenceFactor: 0.8 },
  hospital: { hoursPerYear: 5_800, coincidenceFactor: 0.8 },
  exterior: { hoursPerYear: 4_300, coincidenceFactor: 0 },
  multifamily: { hoursPerYear: 5_000, coincidenceFactor: 0.6 },
  other: { hoursPerYear: 3_500, coincidenceFactor: 0.7 },
};

export const operatingDefaultsSource =
  'from memory: typical US state technical reference manual values, not read from a named TRM; override with your own';

/**
 * The demand interactive factor (1 + HVAC_d). No published default has been
 * adopted here, so 1.0 (no interaction) is used unless the survey gives one.
 */
export const defaultHvacDemandFactor = 1;

export interface SavingsFactors {
  hvacEnergyFactor: number;
  hvacDemandFactor: number;
  coincidenceFactor: number;
  gasThermsPerKwhSaved: number;
}

export interface EnergySide {
  /** Connected watts of all fixtures. */
  watts: number;
  kwhPerYear: number;
}

export interface EnergySavings {
  /** Lighting kWh saved before HVAC interaction. */
  lightingKwhPerYear: number;
  /** ΔkWh including HVAC interaction (UMP). */
  kwhPerYear: number;
  /** Connected demand reduction. */
  connectedKw: number;
  /** Coincident peak demand reduction (UMP): ΔkW × CF × (1 + HVAC_d). */
  peakKw: number;
  /** Gas heating penalty in therms a year (negative: more gas). */
  gasThermsPerYear: number;
}

/**
 * UMP savings from existing and proposed energy.
 *
 * @example energySavings({ watts: 1130, kwhPerYear: 3390 }, { watts: 500, kwhPerYear: 1500 }, { hvacEnergyFactor: 1.08, hvacDemandFactor: 1, coincidenceFactor: 0.7, gasThermsPerKwhSaved: -0.00819 })
 * //=> { lightingKwhPerYear: 1890, kwhPerYear: 2041.2, connectedKw: 0.63, peakKw: 0.441, gasThermsPerYear: -15.48 }
 */
export function energySavings(existing: EnergySide, proposed: EnergySide, factors: SavingsFactors): EnergySavings {
  const lightingKwhPerYear = existing.kwhPerYear - proposed.kwhPerYear;
  const connectedKw = (existing.watts - proposed.watts) / 1000;
  return {
    lightingKwhPerYear,
    kwhPerYear: lightingKwhPerYear * factors.hvacEnergyFactor,
    connectedKw,
    peakKw: connectedKw * factors.coincidenceFactor * factors.hvacDemandFactor,
    gasThermsPerYear: lightingKwhPerYear * factors.gasThermsPerKwhSaved,
  };
}
