/**
 * Electrical load of lighting on branch circuits: apparent power, current,
 * the continuous-load limit of a breaker, default power factors of existing
 * equipment, and power-factor criteria for proposed LED products.
 *
 * Assumption: every branch circuit is single-phase (a line-to-neutral or
 * line-to-line circuit fed at one voltage), so current is I = S / V. Three-
 * phase feeders (I = S / (√3 · V_line)) are not modelled here.
 *
 * These figures help decide whether a circuit has room, they do not replace
 * a load calculation. Work on mains wiring, breakers and panels is for a
 * licensed electrician under the local electrical code.
 */
import type { BallastKind, ExistingTechnology, ProductForm } from '../survey/model.ts';
import { CalcInputError, checkRange } from './errors.ts';

/** Accepted branch-circuit voltages: 1 V up to 1,000 V (the low-voltage limit). */
const minVolts = 1;
const maxVolts = 1000;
/** Accepted breaker ratings for a lighting branch circuit, in amps. */
const minBreakerAmps = 1;
const maxBreakerAmps = 1200;
/** Largest real power accepted for one input (1 GW: anything above is a typing error). */
const maxWatts = 1e9;
/**
 * Accepted power factors: 0.1 to 1, the range the survey model allows for
 * existing equipment. No lighting load runs below 0.1, and the floor keeps
 * S = P / PF finite.
 */
const minPowerFactor = 0.1;

function checkWatts(field: string, watts: number): number {
  return checkRange(field, watts, 0, maxWatts);
}

function checkNonNegative(field: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new CalcInputError(field, `must be a finite number (got ${String(value)})`);
  }
  if (value < 0) throw new CalcInputError(field, `must be 0 or more (got ${value})`);
  return value;
}

function checkPowerFactorValue(field: string, powerFactor: number): number {
  return checkRange(field, powerFactor, minPowerFactor, 1);
}

function checkVolts(field: string, volts: number): number {
  return checkRange(field, volts, minVolts, maxVolts);
}

function checkBreakerAmps(field: string, breakerAmps: number | null): number | null {
  if (breakerAmps === null) return null;
  return checkRange(field, breakerAmps, minBreakerAmps, maxBreakerAmps);
}

/**
 * Apparent power S = P / PF, in volt-amperes, for real power in watts and a
 * power factor in [0.1, 1] (power factor is P / S by definition).
 *
 * @example apparentPowerVoltAmperes(100, 0.5) //=> 200
 */
export function apparentPowerVoltAmperes(watts: number, powerFactor: number): number {
  checkWatts('watts', watts);
  checkPowerFactorValue('powerFactor', powerFactor);
  return watts / powerFactor;
}

/**
 * Current drawn on a single-phase circuit, I = S / V, in amps.
 *
 * @example currentAmps(1440, 120) //=> 12
 */
export function currentAmps(voltAmperes: number, volts: number): number {
  checkNonNegative('voltAmperes', voltAmperes);
  checkVolts('volts', volts);
  return voltAmperes / volts;
}

/**
 * Share of a breaker's rating that a continuous load may use. NEC 210.20(A)
 * sizes the overcurrent device at no less than 125 % of the continuous load,
 * so the continuous load may be at most 1 / 1.25 = 80 % of the rating.
 * Lighting counts as continuous: on for 3 hours or more (NEC Article 100).
 */
export const continuousLoadFraction = 0.8;

/** Summed load of one branch circuit. */
export interface CircuitLoad {
  circuitLabel: string;
  volts: number;
  /** Smallest breaker rating given for this circuit, or null when none was. */
  breakerAmps: number | null;
  watts: number;
  /** Arithmetic sum of the members' VA: an upper bound of the true total. */
  voltAmperes: number;
  amps: number;
  /** breakerAmps × continuousLoadFraction, or null without a breaker rating. */
  allowedContinuousAmps: number | null;
  /** amps / breakerAmps, or null without a breaker rating. */
  loadingFraction: number | null;
  /** True when amps exceed the continuous-load limit; false when no breaker is known. */
  overContinuousLimit: boolean;
}

/** One group of identical fixtures on a circuit (watts already × count). */
export interface CircuitMember {
  circuitLabel: string;
  volts: number;
  breakerAmps: number | null;
  watts: number;
  powerFactor: number;
}

/**
 * Groups loads by circuit label (surrounding spaces ignored, first-seen order
 * kept) and sums watts and volt-amperes per circuit.
 *
 * Volt-amperes add arithmetically. The true total is the vector sum of the
 * members' apparent powers, which needs their phase angles (and harmonic
 * content) that a survey does not record; the arithmetic sum is never smaller,
 * so it is a conservative upper bound for the current. The breaker is the
 * smallest non-null rating seen on the circuit. All members of one circuit
 * must give the same voltage, or a {@link CalcInputError} naming the circuit
 * is thrown.
 *
 * @example
 * sumCircuits([{ circuitLabel: 'B/14', volts: 120, breakerAmps: 20, watts: 1440, powerFactor: 1 }])[0].amps //=> 12
 */
export function sumCircuits(members: readonly CircuitMember[]): CircuitLoad[] {
  interface Group {
    circuitLabel: string;
    volts: number;
    firstIndex: number;
    breakerAmps: number | null;
    watts: number;
    voltAmperes: number;
  }
  const groups = new Map<string, Group>();
  members.forEach((member, index) => {
    const at = `members[${index}]`;
    if (typeof member.circuitLabel !== 'string' || member.circuitLabel.trim() === '') {
      throw new CalcInputError(`${at}.circuitLabel`, 'is empty; name the branch circuit (e.g. "Panel B / 14")');
    }
    const label = member.circuitLabel.trim();
    const volts = checkVolts(`${at}.volts`, member.volts);
    const breakerAmps = checkBreakerAmps(`${at}.breakerAmps`, member.breakerAmps);
    const watts = checkWatts(`${at}.watts`, member.watts);
    const powerFactor = checkPowerFactorValue(`${at}.powerFactor`, member.powerFactor);
    const voltAmperes = watts / powerFactor;

    const group = groups.get(label);
    if (!group) {
      groups.set(label, { circuitLabel: label, volts, firstIndex: index, breakerAmps, watts, voltAmperes });
      return;
    }
    if (group.volts !== volts) {
      throw new CalcInputError(
        `${at}.volts`,
        `circuit "${label}" is given as ${group.volts} V (members[${group.firstIndex}]) and ${volts} V here; one branch circuit has one voltage`,
      );
    }
    if (breakerAmps !== null && (group.breakerAmps === null || breakerAmps < group.breakerAmps)) {
      group.breakerAmps = breakerAmps;
    }
    group.watts += watts;
    group.voltAmperes += voltAmperes;
  });

  return [...groups.values()].map((group) => {
    const amps = group.voltAmperes / group.volts;
    const allowedContinuousAmps = group.breakerAmps === null ? null : group.breakerAmps * continuousLoadFraction;
    return {
      circuitLabel: group.circuitLabel,
      volts: group.volts,
      breakerAmps: group.breakerAmps,
      watts: group.watts,
      voltAmperes: group.voltAmperes,
      amps,
      allowedContinuousAmps,
      loadingFraction: group.breakerAmps === null ? null : amps / group.breakerAmps,
      // A hair of tolerance so rounding in long sums does not flag a load sitting exactly on the limit.
      overContinuousLimit: allowedContinuousAmps !== null && amps > allowedContinuousAmps * (1 + 1e-12),
    };
  });
}

/** Ballasted discharge technologies whose power factor depends on the ballast. */
type DischargeTechnology = Exclude<ExistingTechnology, 'incandescent' | 'halogen' | 'cfl-screw' | 'led' | 'other'>;

/**
 * Power factor of ballasted discharge lamps on a magnetic ballast. Sources:
 * National Lighting Product Information Program, Lighting Answers "Power
 * Quality" (Vol. 2 No. 2, 1995): high power factor (HPF) is 0.9 or more,
 * normal power factor (NPF) 0.5–0.9. Which class is typical for each
 * technology is from memory: commercial 4-ft fluorescent and HID magnetic
 * ballasts were usually HPF; small pin-base CFL reactor ballasts usually NPF.
 */
const magneticPowerFactor: Record<DischargeTechnology, number> = {
  'cfl-pin': 0.5, // from memory: NPF reactor/preheat ballast, at the NLPIP NPF lower bound
  'linear-t12': 0.9, // from memory: HPF rapid-start magnetic, at the NLPIP HPF threshold
  'linear-t8': 0.9, // from memory: as T12
  'linear-t5': 0.9, // from memory: T5 runs on electronic ballasts; figure kept for completeness
  'metal-halide': 0.9, // from memory: HPF (CWA) ballast
  'high-pressure-sodium': 0.9, // from memory: HPF ballast
  'mercury-vapour': 0.9, // from memory: HPF ballast; old NPF reactor ballasts run nearer 0.5
};

/** Power factor of electronic ballasts, from memory (typical manufacturer data ≥ 0.98). */
const electronicBallastPowerFactor = 0.98;

/**
 * Default power factor of existing equipment by technology and ballast, used
 * when the survey gives none:
 * - incandescent and halogen: 1.0 (resistive load); a low-voltage
 *   transformer lowers this somewhat; enter a measured figure when known;
 * - screw-base CFL: 0.55, inside the 0.47–0.67 measured by Lawrence Berkeley
 *   National Laboratory ("Harmonics from Compact Fluorescent Lamps");
 * - existing LED: 0.9 (from memory; varies widely, cheap lamps lower);
 * - ballasted fluorescent and HID: 0.98 on an electronic ballast, the
 *   magnetic figure otherwise (a recorded ballast of 'none' on a technology
 *   that needs one is treated as unknown and given the lower, magnetic figure);
 * - other: 0.98 on an electronic ballast, else 0.5 (the NPF lower bound, so
 *   the circuit check errs towards flagging).
 *
 * @example powerFactorDefault('linear-t8', 'electronic') //=> 0.98
 */
export function powerFactorDefault(technology: ExistingTechnology, ballast: BallastKind): number {
  switch (technology) {
    case 'incandescent':
    case 'halogen':
      return 1;
    case 'cfl-screw':
      return 0.55;
    case 'led':
      return 0.9;
    case 'other':
      return ballast === 'electronic' ? electronicBallastPowerFactor : 0.5;
    case 'cfl-pin':
    case 'linear-t12':
    case 'linear-t8':
    case 'linear-t5':
    case 'metal-halide':
    case 'high-pressure-sodium':
    case 'mercury-vapour':
      return ballast === 'electronic' ? electronicBallastPowerFactor : magneticPowerFactor[technology];
    default: {
      const unknown: never = technology;
      throw new CalcInputError('existing.technology', `"${String(unknown)}" is not a known technology`);
    }
  }
}

/** Which published power-factor criterion a check applies. */
export type PowerFactorRule = 'energy-star-lamp' | 'dlc-luminaire' | 'ja8';

/** Outcome of checking a product's power factor against one criterion. */
export interface PowerFactorCheck {
  rule: PowerFactorRule;
  minimum: number;
  passes: boolean;
  source: string;
}

const energyStarSource = 'ENERGY STAR Lamps V2.0 (2017): PF ≥ 0.7 above 10 W, ≥ 0.6 at or below 10 W';
const dlcSource = 'DesignLights Consortium SSL Technical Requirements V5.1: PF ≥ 0.9 (from memory, verify)';
const ja8Source = 'California Title 24 (2019) Joint Appendix JA8: PF ≥ 0.90 at full rated power (secondary summaries)';

/** The criterion used for each product form when the caller names none. */
const defaultRuleByForm: Record<ProductForm, PowerFactorRule> = {
  'screw-lamp': 'energy-star-lamp',
  'pin-lamp': 'energy-star-lamp',
  // ENERGY STAR Lamps does not list linear tubes (from memory); DLC's tube
  // category asks 0.9. Pass rule 'dlc-luminaire' to apply that instead.
  'linear-tube': 'energy-star-lamp',
  luminaire: 'dlc-luminaire',
  'retrofit-kit': 'dlc-luminaire',
};

function minimumPowerFactor(rule: PowerFactorRule, wattsPerUnit: number): number {
  switch (rule) {
    case 'energy-star-lamp':
      return wattsPerUnit > 10 ? 0.7 : 0.6;
    case 'dlc-luminaire':
    case 'ja8':
      return 0.9;
    default: {
      const unknown: never = rule;
      throw new CalcInputError('rule', `"${String(unknown)}" is not a known power-factor rule`);
    }
  }
}

/**
 * Checks a proposed product's power factor against a published minimum.
 * Lamps (screw, pin, linear tube) default to ENERGY STAR Lamps V2.0;
 * luminaires and retrofit kits to the DLC SSL requirements; `rule` picks
 * another criterion (e.g. 'ja8' for California residential work).
 *
 * @example checkPowerFactor(0.65, 9, 'screw-lamp').passes //=> true
 */
export function checkPowerFactor(
  powerFactor: number,
  wattsPerUnit: number,
  form: ProductForm,
  rule: PowerFactorRule = defaultRuleByForm[form],
): PowerFactorCheck {
  checkPowerFactorValue('proposed.powerFactor', powerFactor);
  checkWatts('proposed.wattsPerUnit', wattsPerUnit);
  if (wattsPerUnit === 0) throw new CalcInputError('proposed.wattsPerUnit', 'must be greater than 0');
  if (!Object.hasOwn(defaultRuleByForm, form)) {
    throw new CalcInputError('proposed.form', `"${String(form)}" is not a known product form`);
  }
  const minimum = minimumPowerFactor(rule, wattsPerUnit);
  const source = rule === 'energy-star-lamp' ? energyStarSource : rule === 'dlc-luminaire' ? dlcSource : ja8Source;
  return { rule, minimum, passes: powerFactor >= minimum, source };
}

/**
 * Kilovolt-amperes from volt-amperes.
 *
 * @example kvaTotal(1500) //=> 1.5
 */
export function kvaTotal(voltAmperes: number): number {
  checkNonNegative('voltAmperes', voltAmperes);
  return voltAmperes / 1000;
}
