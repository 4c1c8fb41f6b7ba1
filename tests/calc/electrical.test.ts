import { createRequire } from 'node:module';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { BallastKind, ExistingTechnology, ProductForm } from '../../src/survey/model.ts';
import { CalcInputError } from '../../src/calc/errors.ts';
import {
  apparentPowerVoltAmperes,
  checkPowerFactor,
  continuousLoadFraction,
  currentAmps,
  kvaTotal,
  powerFactorDefault,
  sumCircuits,
  type CircuitMember,
} from '../../src/calc/electrical.ts';

// convert-units 2.3.4 ships no type declarations; load it through require and
// describe the small part of its API used here.
type ConvertUnits = (value: number) => { from(unit: string): { to(unit: string): number } };
const convert: ConvertUnits = createRequire(import.meta.url)('convert-units');

/** Runs `action` and returns the CalcInputError it throws (fails the test otherwise). */
function inputError(action: () => unknown): CalcInputError {
  try {
    action();
  } catch (error) {
    expect(error).toBeInstanceOf(CalcInputError);
    return error as CalcInputError;
  }
  throw new Error('expected a CalcInputError, but nothing was thrown');
}

function member(overrides: Partial<CircuitMember> = {}): CircuitMember {
  return { circuitLabel: 'Panel B / 14', volts: 120, breakerAmps: 20, watts: 0, powerFactor: 1, ...overrides };
}

describe('apparent power and current', () => {
  it('S = P / PF', () => {
    // IEEE Std 1459-2010: power factor PF = P / S, so S = P / PF (definition; from memory)
    expect(apparentPowerVoltAmperes(100, 0.5)).toBe(200);
    expect(apparentPowerVoltAmperes(1440, 1)).toBe(1440);
    // A resistive load (PF 1) draws exactly its watts in VA: physics definition of apparent power
    expect(apparentPowerVoltAmperes(60, 1)).toBe(60);
    expect(apparentPowerVoltAmperes(90, 0.9)).toBeCloseTo(100, 12);
  });

  it('I = S / V: a 1,440 W lighting load at 120 V and PF 1 draws 12 A', () => {
    // Single-phase current I = S / V (physics definition of apparent power S = V × I)
    expect(currentAmps(apparentPowerVoltAmperes(1440, 1), 120)).toBe(12);
    // Same load on a 277 V circuit: 1440 / 277 A (I = S / V)
    expect(currentAmps(1440, 277)).toBeCloseTo(5.1986, 4);
  });

  it('at PF 0.5 the same 1,440 W draws 24 A', () => {
    // S = P / PF = 2,880 VA; I = S / V = 24 A (IEEE Std 1459-2010 definition of PF, from memory)
    expect(currentAmps(apparentPowerVoltAmperes(1440, 0.5), 120)).toBe(24);
  });

  it('kVA = VA / 1000, cross-checked against convert-units', () => {
    // SI prefix kilo = 10^3; the convert-units package's apparentPower measure gives the same
    expect(kvaTotal(1500)).toBe(1.5);
    expect(kvaTotal(1500)).toBeCloseTo(convert(1500).from('VA').to('kVA'), 12);
    expect(kvaTotal(2880)).toBeCloseTo(convert(2880).from('VA').to('kVA'), 12);
    expect(kvaTotal(0)).toBe(0);
  });
});

describe('continuous-load limit', () => {
  it('is 80 % of the breaker rating', () => {
    // NEC 210.20(A): overcurrent device ≥ 125 % of the continuous load → load ≤ 1 / 1.25 of the rating
    expect(continuousLoadFraction).toBeCloseTo(1 / 1.25, 12);
  });

  it('a 20 A breaker allows 16 A continuous: 1,920 W at 120 V and PF 1 is at the limit, not over', () => {
    // NEC 210.20(A): 20 A / 1.25 = 16 A; 16 A × 120 V = 1,920 W at PF 1
    const [load] = sumCircuits([member({ watts: 1920 })]);
    expect(load).toBeDefined();
    expect(load?.allowedContinuousAmps).toBe(16);
    expect(load?.amps).toBe(16);
    expect(load?.loadingFraction).toBe(0.8);
    expect(load?.overContinuousLimit).toBe(false);
  });

  it('one watt more than 1,920 W on a 20 A, 120 V circuit is over the continuous limit', () => {
    // NEC 210.20(A): 1,921 W / 120 V = 16.008 A > 16 A
    const [load] = sumCircuits([member({ watts: 1921 })]);
    expect(load?.overContinuousLimit).toBe(true);
  });

  it('1,440 W at PF 0.5 draws 24 A: over the 16 A allowed on a 20 A breaker', () => {
    // NEC 210.20(A) limit 16 A; I = (P / PF) / V = 24 A (definition of apparent power)
    const [load] = sumCircuits([member({ watts: 1440, powerFactor: 0.5 })]);
    expect(load?.amps).toBe(24);
    expect(load?.voltAmperes).toBe(2880);
    expect(load?.loadingFraction).toBeCloseTo(1.2, 12);
    expect(load?.overContinuousLimit).toBe(true);
  });

  it('the same 1,440 W at PF 1 is within the limit (12 A of 16 A)', () => {
    // NEC 210.20(A) limit 16 A; I = P / V = 12 A at PF 1
    const [load] = sumCircuits([member({ watts: 1440 })]);
    expect(load?.amps).toBe(12);
    expect(load?.loadingFraction).toBeCloseTo(0.6, 12);
    expect(load?.overContinuousLimit).toBe(false);
  });
});

describe('sumCircuits', () => {
  it('groups by label, sums W and VA arithmetically, and keeps first-seen order', () => {
    // Arithmetic VA sum (common practice, no published source): 100 W @ 0.5 → 200 VA, plus 100 W @ 1 → 100 VA
    const loads = sumCircuits([
      member({ circuitLabel: 'A/1', watts: 100, powerFactor: 0.5 }),
      member({ circuitLabel: 'A/3', watts: 500, volts: 277, breakerAmps: 20 }),
      member({ circuitLabel: ' A/1 ', watts: 100, powerFactor: 1 }),
    ]);
    expect(loads.map((load) => load.circuitLabel)).toEqual(['A/1', 'A/3']);
    const a1 = loads[0];
    expect(a1?.watts).toBe(200);
    expect(a1?.voltAmperes).toBe(300);
    // I = S / V (physics definition): 300 VA / 120 V = 2.5 A
    expect(a1?.amps).toBe(2.5);
    const a3 = loads[1];
    expect(a3?.volts).toBe(277);
    expect(a3?.amps).toBeCloseTo(500 / 277, 12);
  });

  it('uses the smallest breaker rating given on a circuit, ignoring nulls', () => {
    // Common practice, no published source: the smallest recorded breaker governs the circuit
    const [load] = sumCircuits([
      member({ breakerAmps: null, watts: 100 }),
      member({ breakerAmps: 20, watts: 100 }),
      member({ breakerAmps: 15, watts: 100 }),
      member({ breakerAmps: null, watts: 100 }),
    ]);
    expect(load?.breakerAmps).toBe(15);
    // NEC 210.20(A): 15 A × 0.8 = 12 A allowed
    expect(load?.allowedContinuousAmps).toBeCloseTo(12, 12);
  });

  it('reports no limit and no overload when no breaker is known', () => {
    // Without a breaker rating there is nothing to compare (common practice, no published source)
    const [load] = sumCircuits([member({ breakerAmps: null, watts: 5000 })]);
    expect(load?.breakerAmps).toBeNull();
    expect(load?.allowedContinuousAmps).toBeNull();
    expect(load?.loadingFraction).toBeNull();
    expect(load?.overContinuousLimit).toBe(false);
    // I = S / V: 5,000 W / 120 V
    expect(load?.amps).toBeCloseTo(41.667, 3);
  });

  it('returns nothing for no members', () => {
    expect(sumCircuits([])).toEqual([]);
  });

  it('rejects members of one circuit that disagree on voltage, naming the circuit', () => {
    const error = inputError(() =>
      sumCircuits([member({ circuitLabel: 'Panel B / 14', volts: 120 }), member({ circuitLabel: 'Panel B / 14', volts: 277 })]),
    );
    expect(error.field).toBe('members[1].volts');
    expect(error.message).toContain('Panel B / 14');
  });

  it('rejects bad members with the field named', () => {
    expect(inputError(() => sumCircuits([member({ circuitLabel: '  ' })])).field).toBe('members[0].circuitLabel');
    expect(inputError(() => sumCircuits([member(), member({ watts: -1 })])).field).toBe('members[1].watts');
    expect(inputError(() => sumCircuits([member({ watts: Number.NaN })])).field).toBe('members[0].watts');
    expect(inputError(() => sumCircuits([member({ volts: 0 })])).field).toBe('members[0].volts');
    expect(inputError(() => sumCircuits([member({ breakerAmps: 0 })])).field).toBe('members[0].breakerAmps');
    expect(inputError(() => sumCircuits([member({ powerFactor: 0 })])).field).toBe('members[0].powerFactor');
    expect(inputError(() => sumCircuits([member({ powerFactor: 1.2 })])).field).toBe('members[0].powerFactor');
  });
});

describe('invalid input to the single-value functions', () => {
  it('names the field', () => {
    expect(inputError(() => apparentPowerVoltAmperes(-5, 0.9)).field).toBe('watts');
    expect(inputError(() => apparentPowerVoltAmperes(Number.NaN, 0.9)).field).toBe('watts');
    expect(inputError(() => apparentPowerVoltAmperes(100, 0)).field).toBe('powerFactor');
    expect(inputError(() => apparentPowerVoltAmperes(100, 1.01)).field).toBe('powerFactor');
    expect(inputError(() => apparentPowerVoltAmperes(100, Number.POSITIVE_INFINITY)).field).toBe('powerFactor');
    expect(inputError(() => currentAmps(100, 0)).field).toBe('volts');
    expect(inputError(() => currentAmps(-1, 120)).field).toBe('voltAmperes');
    expect(inputError(() => kvaTotal(Number.NaN)).field).toBe('voltAmperes');
  });
});

describe('properties', () => {
  const watts = fc.double({ min: 0, max: 1e6, noNaN: true });
  const powerFactor = fc.double({ min: 0.1, max: 1, noNaN: true });
  const volts = fc.constantFrom(12, 24, 100, 120, 208, 230, 240, 277, 347, 480);

  it('VA ≥ W always', () => {
    // PF ≤ 1 by definition (IEEE Std 1459-2010, from memory), so S = P / PF ≥ P
    fc.assert(fc.property(watts, powerFactor, (w, pf) => apparentPowerVoltAmperes(w, pf) >= w));
  });

  it('amps scale linearly with watts', () => {
    // I = P / (PF × V) is linear in P (physics definition of apparent power)
    fc.assert(
      fc.property(watts, fc.double({ min: 0, max: 100, noNaN: true }), powerFactor, volts, (w, k, pf, v) => {
        const single = currentAmps(apparentPowerVoltAmperes(w, pf), v);
        const scaled = currentAmps(apparentPowerVoltAmperes(k * w, pf), v);
        expect(scaled).toBeCloseTo(k * single, 6);
      }),
    );
  });

  it('circuit sums equal the sum of their members and are never NaN', () => {
    // Arithmetic sums of W and VA (common practice, no published source); I = S / V
    const memberArb = fc.record({
      circuitLabel: fc.constantFrom('A/1', 'A/2', 'B/7'),
      volts: fc.constant(120),
      breakerAmps: fc.option(fc.constantFrom(15, 20, 30), { nil: null }),
      watts,
      powerFactor,
    });
    fc.assert(
      fc.property(fc.array(memberArb, { maxLength: 40 }), (members) => {
        const loads = sumCircuits(members);
        const totalWatts = members.reduce((sum, m) => sum + m.watts, 0);
        const totalVa = members.reduce((sum, m) => sum + m.watts / m.powerFactor, 0);
        expect(loads.reduce((sum, l) => sum + l.watts, 0)).toBeCloseTo(totalWatts, 3);
        expect(loads.reduce((sum, l) => sum + l.voltAmperes, 0)).toBeCloseTo(totalVa, 3);
        for (const load of loads) {
          for (const value of [load.watts, load.voltAmperes, load.amps, load.loadingFraction ?? 0, load.allowedContinuousAmps ?? 0]) {
            expect(Number.isNaN(value)).toBe(false);
          }
          expect(load.voltAmperes).toBeGreaterThanOrEqual(load.watts);
          expect(load.amps).toBeCloseTo(load.voltAmperes / 120, 9);
          if (load.allowedContinuousAmps !== null) {
            expect(load.overContinuousLimit).toBe(load.amps > load.allowedContinuousAmps * (1 + 1e-12));
          }
        }
      }),
    );
  });

  it('any power factor outside [0.1, 1] is rejected with the field named', () => {
    const bad = fc.oneof(
      fc.double({ max: 0.0999, noNaN: true }),
      fc.double({ min: 1.0001, noNaN: true }),
      fc.constant(Number.NaN),
    );
    fc.assert(fc.property(bad, (pf) => inputError(() => apparentPowerVoltAmperes(100, pf)).field === 'powerFactor'));
  });
});

describe('powerFactorDefault', () => {
  const technologies: ExistingTechnology[] = [
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
  ];
  const ballasts: BallastKind[] = ['none', 'magnetic', 'electronic'];

  it('incandescent and halogen are resistive: PF 1', () => {
    // A resistive load draws current in phase with voltage: PF = 1 (physics; NLPIP "Power Quality" 1995)
    for (const ballast of ballasts) {
      expect(powerFactorDefault('incandescent', ballast)).toBe(1);
      expect(powerFactorDefault('halogen', ballast)).toBe(1);
    }
  });

  it('screw-base CFL lies within the measured range', () => {
    // LBNL "Harmonics from Compact Fluorescent Lamps": measured CFL PF 0.47–0.67
    const pf = powerFactorDefault('cfl-screw', 'none');
    expect(pf).toBeGreaterThanOrEqual(0.47);
    expect(pf).toBeLessThanOrEqual(0.67);
  });

  it('electronic ballasts are high power factor; magnetic figures fall in the NLPIP classes', () => {
    // NLPIP Lighting Answers "Power Quality" (1995): HPF ≥ 0.9; NPF 0.5–0.9
    expect(powerFactorDefault('linear-t8', 'electronic')).toBe(0.98); // from memory: typical electronic ballast data
    expect(powerFactorDefault('linear-t12', 'magnetic')).toBeGreaterThanOrEqual(0.9); // HPF class, from memory
    expect(powerFactorDefault('metal-halide', 'magnetic')).toBeGreaterThanOrEqual(0.9); // HPF class, from memory
    const pinMagnetic = powerFactorDefault('cfl-pin', 'magnetic'); // NPF class, from memory
    expect(pinMagnetic).toBeGreaterThanOrEqual(0.5);
    expect(pinMagnetic).toBeLessThan(0.9);
    // A ballasted lamp recorded without a ballast gets the (lower) magnetic figure
    expect(powerFactorDefault('cfl-pin', 'none')).toBe(pinMagnetic);
    expect(powerFactorDefault('led', 'none')).toBe(0.9); // from memory
  });

  it('every technology and ballast gives a power factor in [0.1, 1], and electronic never below magnetic', () => {
    // PF lies in (0, 1] by definition (IEEE Std 1459-2010, from memory)
    for (const technology of technologies) {
      for (const ballast of ballasts) {
        const pf = powerFactorDefault(technology, ballast);
        expect(pf).toBeGreaterThanOrEqual(0.1);
        expect(pf).toBeLessThanOrEqual(1);
      }
      expect(powerFactorDefault(technology, 'electronic')).toBeGreaterThanOrEqual(powerFactorDefault(technology, 'magnetic'));
    }
  });
});

describe('checkPowerFactor', () => {
  it('lamps above 10 W need PF ≥ 0.7', () => {
    // ENERGY STAR Lamps V2.0: PF ≥ 0.7 above 10 W
    const pass = checkPowerFactor(0.7, 12, 'screw-lamp');
    expect(pass).toMatchObject({ rule: 'energy-star-lamp', minimum: 0.7, passes: true });
    expect(pass.source).toContain('ENERGY STAR Lamps V2.0');
    expect(checkPowerFactor(0.69, 12, 'screw-lamp').passes).toBe(false);
    // 10.5 W is above 10 W, so 0.65 fails (ENERGY STAR Lamps V2.0)
    expect(checkPowerFactor(0.65, 10.5, 'pin-lamp').passes).toBe(false);
  });

  it('lamps at or below 10 W need PF ≥ 0.6', () => {
    // ENERGY STAR Lamps V2.0: PF ≥ 0.6 at or below 10 W
    expect(checkPowerFactor(0.6, 10, 'screw-lamp')).toMatchObject({ minimum: 0.6, passes: true });
    expect(checkPowerFactor(0.59, 10, 'screw-lamp').passes).toBe(false);
    expect(checkPowerFactor(0.65, 9, 'pin-lamp').passes).toBe(true);
  });

  it('linear tubes use the lamp criterion by default, and DLC on request', () => {
    // ENERGY STAR Lamps V2.0: 18 W → 0.7; DLC SSL V5.1 0.9 (from memory)
    expect(checkPowerFactor(0.8, 18, 'linear-tube')).toMatchObject({ rule: 'energy-star-lamp', minimum: 0.7, passes: true });
    expect(checkPowerFactor(0.8, 18, 'linear-tube', 'dlc-luminaire')).toMatchObject({ rule: 'dlc-luminaire', minimum: 0.9, passes: false });
  });

  it('luminaires and retrofit kits need PF ≥ 0.9', () => {
    // DesignLights Consortium SSL Technical Requirements V5.1: PF ≥ 0.90 (from memory)
    const forms: ProductForm[] = ['luminaire', 'retrofit-kit'];
    for (const form of forms) {
      const check = checkPowerFactor(0.9, 40, form);
      expect(check).toMatchObject({ rule: 'dlc-luminaire', minimum: 0.9, passes: true });
      expect(check.source).toContain('from memory');
      expect(checkPowerFactor(0.89, 40, form).passes).toBe(false);
    }
  });

  it('applies JA8 when asked', () => {
    // California Title 24 (2019) JA8: PF ≥ 0.90 at full rated power (secondary summaries)
    expect(checkPowerFactor(0.85, 9, 'screw-lamp', 'ja8')).toMatchObject({ rule: 'ja8', minimum: 0.9, passes: false });
    expect(checkPowerFactor(0.92, 9, 'screw-lamp', 'ja8').passes).toBe(true);
  });

  it('rejects bad input with the field named', () => {
    expect(inputError(() => checkPowerFactor(0, 10, 'screw-lamp')).field).toBe('proposed.powerFactor');
    expect(inputError(() => checkPowerFactor(1.5, 10, 'screw-lamp')).field).toBe('proposed.powerFactor');
    expect(inputError(() => checkPowerFactor(0.9, 0, 'luminaire')).field).toBe('proposed.wattsPerUnit');
    expect(inputError(() => checkPowerFactor(0.9, Number.NaN, 'luminaire')).field).toBe('proposed.wattsPerUnit');
  });
});
