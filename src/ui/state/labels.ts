/**
 * Words the screens use for the model's closed sets: plain trade terms, so a
 * contractor reads them the way they would say them on site.
 */
import type {
  BallastKind,
  BuildingType,
  ControlChange,
  DimmerKind,
  Distribution,
  ExistingTechnology,
  HeatingType,
  MoistureRating,
  ProductForm,
  TubeType,
  UnitsSystem,
} from '../../survey/model.ts';
import type { Severity } from '../../calc/warnings.ts';

export const technologyLabels: Readonly<Record<ExistingTechnology, string>> = {
  incandescent: 'Incandescent',
  halogen: 'Halogen',
  'cfl-screw': 'CFL, screw base',
  'cfl-pin': 'CFL, pin base',
  'linear-t12': 'Fluorescent tube, T12',
  'linear-t8': 'Fluorescent tube, T8',
  'linear-t5': 'Fluorescent tube, T5',
  'metal-halide': 'Metal halide',
  'high-pressure-sodium': 'High-pressure sodium',
  'mercury-vapour': 'Mercury vapour',
  led: 'LED (already)',
  other: 'Other',
};

export const ballastLabels: Readonly<Record<BallastKind, string>> = {
  none: 'No ballast',
  magnetic: 'Magnetic ballast',
  electronic: 'Electronic ballast',
};

export const dimmerLabels: Readonly<Record<DimmerKind, string>> = {
  none: 'No dimmer',
  'leading-edge': 'Leading-edge (incandescent type)',
  'trailing-edge': 'Trailing-edge (LED type)',
  '0-10v': '0-10 V control',
  unknown: 'Dimmer, type unknown',
};

export const moistureLabels: Readonly<Record<MoistureRating, string>> = {
  dry: 'Dry',
  damp: 'Damp',
  wet: 'Wet',
};

export const formLabels: Readonly<Record<ProductForm, string>> = {
  'screw-lamp': 'Screw-base lamp',
  'pin-lamp': 'Pin-base lamp',
  'linear-tube': 'Linear tube',
  luminaire: 'Complete luminaire',
  'retrofit-kit': 'Retrofit kit',
};

export const tubeLabels: Readonly<Record<TubeType, string>> = {
  'not-a-tube': 'Not a tube',
  'type-a': 'Type A (runs on the ballast)',
  'type-b': 'Type B (ballast bypass)',
  'type-c': 'Type C (remote driver)',
  'type-a-b': 'Type A/B (either)',
};

export const distributionLabels: Readonly<Record<Distribution, string>> = {
  'direct-narrow': 'Direct, narrow beam',
  'direct-wide': 'Direct, wide',
  'semi-direct': 'Semi-direct',
  diffuse: 'Diffuse',
  indirect: 'Indirect',
};

export const controlLabels: Readonly<Record<ControlChange, string>> = {
  none: 'No change',
  'occupancy-sensor': 'Occupancy sensor',
  'vacancy-sensor': 'Vacancy sensor',
  'daylight-dimming': 'Daylight dimming',
  timer: 'Time switch',
};

export const buildingLabels: Readonly<Record<BuildingType, string>> = {
  'office-large': 'Office, 20,000–100,000 ft²',
  'office-small': 'Office, under 20,000 ft²',
  school: 'School (K-12)',
  retail: 'Retail',
  warehouse: 'Warehouse',
  restaurant: 'Restaurant',
  hospital: 'Hospital',
  exterior: 'Exterior lighting',
  multifamily: 'Multifamily housing',
  other: 'Other',
};

export const heatingLabels: Readonly<Record<HeatingType, string>> = {
  'electric-resistance': 'Electric resistance',
  'heat-pump': 'Heat pump',
  fossil: 'Gas or oil',
  refrigerated: 'Refrigerated space',
  unconditioned: 'Not heated or cooled',
};

export const unitsLabels: Readonly<Record<UnitsSystem, string>> = {
  si: 'Metric (m, lx)',
  imperial: 'Imperial (ft, fc)',
};

/** Lampwalk's own names for the three warning severities. */
export const severityLabels: Readonly<Record<Severity, string>> = {
  danger: 'Hazard',
  caution: 'Rethink',
  advice: 'Check',
};

/**
 * Options for a select, in the order of the record.
 *
 * @example optionsOf({ dry: 'Dry', wet: 'Wet' }) //=> [{ value: 'dry', label: 'Dry' }, { value: 'wet', label: 'Wet' }]
 */
export function optionsOf<K extends string>(labels: Readonly<Record<K, string>>): { value: K; label: string }[] {
  return (Object.keys(labels) as K[]).map((value) => ({ value, label: labels[value] }));
}
