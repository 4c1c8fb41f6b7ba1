import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  applyChoices,
  cctBandKelvin,
  chooseProducts,
  explainEntry,
  proposalFromProduct,
  ratingReasons,
  type CandidateOutcome,
  type ChoiceReason,
} from '../../src/calc/choice.ts';
import { relampCostPerYear } from '../../src/calc/costs.ts';
import { analyseInvestment } from '../../src/calc/economics.ts';
import { typicalLampLifeHours } from '../../src/calc/equipment.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { ratingRules, safetyDeferral } from '../../src/calc/warnings.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog, proposalFromCatalog } from '../../src/survey/examples.ts';
import type { CatalogProduct, FixtureConditions, FixtureEntry, Room, Survey } from '../../src/survey/model.ts';

// Invented test data throughout.

function product(id: string, patch: Partial<CatalogProduct> = {}): CatalogProduct {
  return {
    id,
    sku: id,
    name: `Test ${id}`,
    form: 'screw-lamp',
    tubeType: 'not-a-tube',
    unitsPerFixture: 1,
    wattsPerUnit: 9,
    lumensPerUnit: 800,
    cctKelvin: 2700,
    cri: 80,
    powerFactor: 0.9,
    dimmable: false,
    enclosedRated: false,
    moistureRating: 'dry',
    insulationContactRated: false,
    emergencyListed: false,
    ratedLifeHours: 15_000,
    distribution: 'diffuse',
    unitCost: 3,
    installMinutesPerFixture: 3,
    rebatePerFixture: 0,
    example: false,
    retired: false,
    ...patch,
  };
}

const dry120: FixtureConditions = { enclosed: false, dimmer: 'none', location: 'dry', emergencyCircuit: false, insulationContact: false, circuitVolts: 120 };

/** One room, one entry: ten 60 W incandescent pendants, 3,000 h a year. Money kept simple for hand working. */
function survey(entryPatch: Partial<FixtureEntry> = {}, roomPatch: Partial<Room> = {}, conditions: Partial<FixtureConditions> = {}): Survey {
  const base = demoSurvey();
  const entry: FixtureEntry = {
    id: 'e1',
    count: 10,
    existing: { technology: 'incandescent', description: 'Pendant, 60 W lamp', lampsPerFixture: 1, ratedWattsPerLamp: 60, ballast: 'none' },
    conditions: { ...dry120, ...conditions },
    proposed: null,
    control: 'none',
    notes: '',
    ...entryPatch,
  };
  return {
    ...base,
    id: 'test-survey',
    units: 'si',
    money: {
      currency: 'USD',
      energyRatePerKwh: 0.15,
      demandChargePerKwMonth: 0,
      energyEscalationPerYear: 0,
      discountRatePerYear: 0.03,
      analysisYears: 10,
      labourRatePerHour: 60,
      markupFraction: 0,
      taxFraction: 0,
      taxBase: 'materials',
      lampRecyclingCostEach: 0,
      ballastDisposalCostEach: 0,
      relampMinutes: 0,
    },
    savings: { hvacEnergyFactor: 1, hvacDemandFactor: 1, coincidenceFactor: 1, gasThermsPerKwhSaved: 0 },
    rooms: [
      {
        id: 'r1',
        name: 'Office',
        spaceType: 'office-enclosed',
        floor: { kind: 'rectangle', lengthMetres: 5, widthMetres: 4 },
        ceilingHeightMetres: 2.7,
        workPlaneHeightMetres: 0.76,
        hours: { kind: 'annual', hoursPerYear: 3000 },
        colourCritical: false,
        photometry: {},
        entries: [entry],
        notes: '',
        ...roomPatch,
      },
    ],
  };
}

/** The judgement of `candidate` for the test entry. */
function judged(s: Survey, catalog: readonly CatalogProduct[], id: string): CandidateOutcome {
  const found = explainEntry(s, catalog, 'e1').candidates.find((c) => c.productId === id);
  if (!found) throw new Error(`no candidate ${id}`);
  return found;
}

function codes(c: CandidateOutcome): ChoiceReason[] {
  return c.reasons.map((r) => r.code);
}

// A: 9 W, 800 lm, $3, 15,000 h. B: 8 W, 800 lm, $6, 25,000 h.
const lampA = product('a');
const lampB = product('b', { wattsPerUnit: 8, unitCost: 6, ratedLifeHours: 25_000 });

describe('life-cycle cost, worked by hand', () => {
  it('ranks the cheaper lamp over ten years at 3 %', () => {
    // Per fixture, no markup, tax, rebate or disposal; energy not escalated; relamp labour 0 min.
    // UPV(3 %, 10 y) = (1 − 1.03^−10) / 0.03 = (1 − 0.744094) / 0.03 = 8.530203 (NIST Handbook 135 UPV formula).
    // A: first cost 3 + 3 min × $60/h = 3 + 3 = 6
    //    energy 9 W × 3,000 h = 27 kWh × $0.15 = 4.05 a year; relamps 3,000/15,000 × $3 = 0.60 a year
    //    LCC = 6 + (4.05 + 0.60) × 8.530203 = 6 + 39.665444 = 45.665444 per fixture → 456.65444 for ten
    // B: first cost 6 + 3 = 9; energy 8 × 3,000 / 1,000 × 0.15 = 3.60; relamps 3,000/25,000 × 6 = 0.72
    //    LCC = 9 + 4.32 × 8.530203 = 9 + 36.850477 = 45.850477 per fixture → 458.50477
    const choice = chooseProducts(survey(), [lampB, lampA]);
    const e = choice.entries[0]!;
    expect(e.best?.productId).toBe('a');
    expect(e.best?.lifeCycleCostPerFixture).toBeCloseTo(45.665444, 5);
    expect(e.best?.lifeCycleCost).toBeCloseTo(456.65444, 4);
    const b = e.candidates.find((c) => c.productId === 'b')!;
    expect(b.accepted).toBe(true);
    expect(b.lifeCycleCostPerFixture).toBeCloseTo(45.850477, 5);
    expect(e.candidates.map((c) => c.productId)).toEqual(['a', 'b']);
    expect(e.changed).toBe(true);
    expect(e.current).toBeNull();
  });

  it('breaks ties by more lumens, then by id', () => {
    // Same price, watts and life: equal LCC. 820 lm leaves 656 lm (ratio 1.025, inside the band) and wins on light.
    const brighter = product('z-bright', { lumensPerUnit: 820 });
    const twin = product('c-twin');
    const choice = chooseProducts(survey(), [lampA, twin, brighter]);
    const order = choice.entries[0]!.candidates.map((c) => c.productId);
    expect(order).toEqual(['z-bright', 'a', 'c-twin']);
    expect(choice.entries[0]!.best?.productId).toBe('z-bright');
  });
});

describe('LCC agrees with the survey calculation', () => {
  it('LCC = PV(existing operating cost) − net savings calculateSurvey reports, for every demo entry and example product', () => {
    const demo = demoSurvey();
    const m = demo.money;
    let checked = 0;
    for (const room of demo.rooms) {
      for (const entry of room.entries) {
        const explained = explainEntry(demo, exampleCatalog, entry.id);
        for (const candidate of explained.candidates) {
          const p = exampleCatalog.find((x) => x.id === candidate.productId)!;
          const alone: Survey = { ...demo, rooms: [{ ...room, entries: [{ ...entry, proposed: proposalFromCatalog(p) }] }] };
          const result = calculateSurvey(alone);
          const r = result.rooms[0]!.entries[0]!;
          const f = result.factors;
          const e = entry.existing;
          const before = relampCostPerYear(
            entry.count * e.lampsPerFixture,
            result.rooms[0]!.hoursPerYear,
            e.lampLifeHours ?? typicalLampLifeHours[e.technology],
            e.lampPrice ?? 0,
            m.relampMinutes,
            m.labourRatePerHour,
          );
          const existingOperating = analyseInvestment({
            netInvestment: 0,
            energySavingsFirstYear: r.existing.kwhPerYear * f.hvacEnergyFactor * m.energyRatePerKwh,
            demandSavingsFirstYear: (r.existing.watts / 1000) * f.coincidenceFactor * f.hvacDemandFactor * m.demandChargePerKwMonth * 12,
            maintenanceSavingsPerYear: before,
            energyEscalationPerYear: m.energyEscalationPerYear,
            discountRatePerYear: m.discountRatePerYear,
            analysisYears: m.analysisYears,
          }).presentValueOfSavings;
          const expected = existingOperating - result.economics.netPresentValue;
          expect(Math.abs(candidate.lifeCycleCost! - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected)));
          checked++;
        }
      }
    }
    expect(checked).toBe(demo.rooms.reduce((n, r) => n + r.entries.length, 0) * exampleCatalog.length);
  });

  it('the room rule uses the lumen method exactly as calculateSurvey does', () => {
    // A screw CFL with no lumens recorded: today's light unknown, so the room decides.
    const s = survey({ existing: { technology: 'cfl-screw', description: 'CFL 15 W', lampsPerFixture: 1, ratedWattsPerLamp: 15, ballast: 'none' } });
    for (const p of [lampA, product('dim', { lumensPerUnit: 300 }), product('big', { lumensPerUnit: 3000, wattsPerUnit: 30 })]) {
      const c = judged(s, [p], p.id);
      const withIt = { ...s, rooms: [{ ...s.rooms[0]!, entries: [{ ...s.rooms[0]!.entries[0]!, proposed: proposalFromProduct(p) }] }] };
      const adequacy = calculateSurvey(withIt).rooms[0]!.adequacy;
      const ratio = adequacy.proposedLux! / adequacy.targetLux;
      // Thresholds of the illuminance-short / -over warnings: 80 % and 150 % (common practice, no published source).
      const expected: ChoiceReason[] = ratio < 0.8 ? ['room-under-target'] : ratio > 1.5 ? ['room-over-target'] : [];
      expect(codes(c)).toEqual(expected);
      const luxText = `${Math.round(adequacy.proposedLux!)} lx`;
      if (expected.length > 0) expect(c.reasons[0]!.message).toContain(luxText);
      else expect(c.notes.find((n) => n.code === 'light-by-room')?.message).toContain(luxText);
    }
  });
});

describe('each constraint turns a product down with its reason', () => {
  it('dimmer: a non-dimmable lamp on a dimmed circuit', () => {
    const dimmable = product('dimmable', { dimmable: true, unitCost: 5 });
    const s = survey({}, {}, { dimmer: 'leading-edge' });
    const c = chooseProducts(s, [lampA, dimmable]).entries[0]!;
    expect(c.best?.productId).toBe('dimmable');
    expect(judged(s, [lampA], 'a').reasons).toEqual([{ code: 'not-dimmable', message: 'not dimmable, and this circuit has a dimmer' }]);
    expect(c.best?.notes.map((n) => n.code)).toContain('dimmer-compatibility');
    // 0-10 V: a dimmable screw lamp cannot take the control wires; a dimmable luminaire can.
    const s010 = survey({}, {}, { dimmer: '0-10v' });
    expect(codes(judged(s010, [dimmable], 'dimmable'))).toEqual(['dimmer-kind']);
    const luminaire = product('lum', { form: 'luminaire', dimmable: true, lumensPerUnit: 640 });
    expect(judged(s010, [luminaire], 'lum').accepted).toBe(true);
  });

  it('enclosed: a lamp not rated for totally enclosed fixtures', () => {
    const s = survey({}, {}, { enclosed: true });
    expect(judged(s, [lampA], 'a').reasons).toEqual([{ code: 'not-enclosed-rated', message: 'not rated for enclosed fixtures' }]);
    expect(judged(s, [product('enc', { enclosedRated: true })], 'enc').accepted).toBe(true);
  });

  it('damp and wet: the rating must reach the location (dry < damp < wet)', () => {
    const damp = product('damp', { moistureRating: 'damp' });
    const wet = survey({}, {}, { location: 'wet' });
    expect(judged(wet, [damp], 'damp').reasons).toEqual([{ code: 'moisture-rating', message: 'rated for damp locations only; this one is wet' }]);
    expect(judged(wet, [product('w', { moistureRating: 'wet' })], 'w').accepted).toBe(true);
    const dampPlace = survey({}, {}, { location: 'damp' });
    expect(codes(judged(dampPlace, [lampA], 'a'))).toEqual(['moisture-rating']);
    expect(judged(dampPlace, [damp], 'damp').accepted).toBe(true);
  });

  it('insulation contact: a new luminaire must be IC-rated; a lamp is accepted with a note about the housing', () => {
    const s = survey({}, {}, { insulationContact: true });
    const lum = product('lum', { form: 'luminaire', lumensPerUnit: 640 });
    expect(judged(s, [lum], 'lum').reasons).toEqual([{ code: 'not-ic-rated', message: 'not IC-rated, and the fixture touches insulation' }]);
    expect(judged(s, [{ ...lum, id: 'ic', insulationContactRated: true }], 'ic').accepted).toBe(true);
    const lamp = judged(s, [lampA], 'a');
    expect(lamp.accepted).toBe(true);
    const note = lamp.notes.find((n) => n.code === 'insulation-contact')!;
    expect(note.safety).toBe(true);
    expect(note.message.endsWith(safetyDeferral)).toBe(true);
  });

  it('emergency circuit: only a listed product', () => {
    const s = survey({}, {}, { emergencyCircuit: true });
    expect(judged(s, [lampA], 'a').reasons).toEqual([{ code: 'not-emergency-listed', message: 'not listed for emergency circuits' }]);
    const listed = judged(s, [product('em', { emergencyListed: true })], 'em');
    expect(listed.accepted).toBe(true);
    expect(listed.notes.find((n) => n.code === 'emergency-circuit')?.safety).toBe(true);
  });

  it('CRI: 80 in general interiors, 90 where colour is critical', () => {
    // CRI ≥ 80: ENERGY STAR Integral LED Lamps; DLC technical requirements for indoor luminaires (from memory).
    // CRI ≥ 90 for colour-critical work: IES guidance for retail display and art (from memory); California Title 24 JA8.
    const cri79 = product('c79', { cri: 79 });
    expect(codes(judged(survey(), [cri79], 'c79'))).toEqual(['cri-too-low']);
    expect(judged(survey(), [lampA], 'a').accepted).toBe(true);
    const critical = survey({}, { colourCritical: true });
    const c80 = judged(critical, [lampA], 'a');
    expect(codes(c80)).toEqual(['cri-too-low']);
    expect(c80.reasons[0]!.message).toBe('CRI 80 is below the 90 this space needs (colour matters here)');
    expect(judged(critical, [product('c90', { cri: 90 })], 'c90').accepted).toBe(true);
  });

  it('CCT: within the ANSI C78.377 band of the preferred nominal CCT', () => {
    // ANSI C78.377 (from memory): 3000 K nominal = 3045 ± 175 K, 2700 K = 2725 ± 145 K.
    expect(cctBandKelvin(3000)).toEqual({ minKelvin: 2870, maxKelvin: 3220 });
    expect(cctBandKelvin(2700)).toEqual({ minKelvin: 2580, maxKelvin: 2870 });
    // A preference off the table uses the flexible-CCT tolerance: about ±210 K at 3,300 K.
    const flexible = cctBandKelvin(3300);
    expect(flexible.maxKelvin - 3300).toBeGreaterThan(190);
    expect(flexible.maxKelvin - 3300).toBeLessThan(230);
    const s = survey({}, { preferredCctKelvin: 3000 });
    const warm = judged(s, [lampA], 'a');
    expect(codes(warm)).toEqual(['cct-mismatch']);
    expect(warm.reasons[0]!.message).toBe('2700 K is outside the 2870–3220 K band of the 3000 K wanted here');
    expect(judged(s, [product('k30', { cctKelvin: 3000 })], 'k30').accepted).toBe(true);
    expect(judged(s, [product('k31', { cctKelvin: 3100 })], 'k31').accepted).toBe(true);
  });

  it('voltage: a 120 V-only product on a 277 V circuit; an unrecorded rating is a note, not a rejection', () => {
    const s = survey({}, {}, { circuitVolts: 277 });
    const only120 = product('v120', { inputVoltsMin: 120, inputVoltsMax: 120 });
    expect(judged(s, [only120], 'v120').reasons).toEqual([{ code: 'voltage-mismatch', message: 'rated 120–120 V; this circuit is 277 V' }]);
    expect(judged(s, [product('univ', { inputVoltsMin: 120, inputVoltsMax: 277 })], 'univ').accepted).toBe(true);
    const unknown = judged(s, [lampA], 'a');
    expect(unknown.accepted).toBe(true);
    expect(unknown.notes.map((n) => n.code)).toContain('voltage-unknown');
  });

  it('light: too few lumens leaving the fixture, by the warnings’ 85–130 % band', () => {
    // 60 W incandescent ≈ 800 lm (US DOE / FTC 16 CFR 305); both sides lose the housing's 80 %.
    // 400 lm lamp: 400 × 0.8 / (800 × 0.8) = 50 % → short. 1,100 lm: 137.5 % → over.
    const dim = judged(survey(), [product('dim', { lumensPerUnit: 400 })], 'dim');
    expect(dim.reasons).toEqual([{ code: 'too-little-light', message: 'too little light: 50 % of today’s' }]);
    // Over the band is a rejection while another product suits the fixture…
    const hot = product('hot', { lumensPerUnit: 1100 });
    expect(codes(judged(survey(), [hot, lampA], 'hot'))).toEqual(['too-much-light']);
    expect(explainEntry(survey(), [hot, lampA], 'e1').best?.productId).toBe('a');
    // …but when every suitable product over-lights, the cheapest is still proposed, with a note.
    const alone = explainEntry(survey(), [hot], 'e1');
    expect(alone.best?.productId).toBe('hot');
    expect(alone.best?.notes.find((n) => n.code === 'more-light-than-needed')?.message).toContain('far more light than today: 138 %');
    expect(judged(survey(), [product('dim', { lumensPerUnit: 400 }), hot], 'dim').accepted).toBe(false);
    // 680 lm is exactly 85 %: inside the band (ends included, as judgeLumens).
    expect(judged(survey(), [product('edge', { lumensPerUnit: 680 })], 'edge').accepted).toBe(true);
  });

  it('form: the product must fit the existing equipment', () => {
    const tube = product('tube', { form: 'linear-tube', tubeType: 'type-b' });
    expect(judged(survey(), [tube], 'tube').reasons).toEqual([{ code: 'form-mismatch', message: 'a linear tube does not fit a screw-base incandescent socket' }]);
    const kit = product('kit', { form: 'retrofit-kit', lumensPerUnit: 640 });
    expect(judged(survey(), [kit], 'kit').accepted).toBe(true);
    // Existing LED equipment: only a luminaire or kit.
    const led = survey({ existing: { technology: 'led', description: 'LED', lampsPerFixture: 1, ratedWattsPerLamp: 9, lumensPerLamp: 800, ballast: 'none' } });
    expect(codes(judged(led, [lampA], 'a'))).toContain('form-mismatch');
  });

  it('retired products are never chosen', () => {
    const retired = product('old', { retired: true, unitCost: 0.1 });
    const choice = chooseProducts(survey(), [retired, lampA]).entries[0]!;
    expect(choice.best?.productId).toBe('a');
    const r = choice.candidates.find((c) => c.productId === 'old')!;
    expect(r.reasons).toEqual([{ code: 'retired', message: 'retired from the catalog' }]);
  });

  it('tubes: Type A needs a ballast it can run on; Type B is allowed with the ballast-bypass safety caution', () => {
    const t8 = (ballast: 'electronic' | 'magnetic' | 'none') =>
      survey({ existing: { technology: 'linear-t8', description: '2-lamp T8', lampsPerFixture: 2, ratedWattsPerLamp: 32, lumensPerLamp: 2800, ballast } });
    // Today: 2 × 2,800 lm × BF 0.88 (electronic) × 0.7 housing = 3,449.6 lm, or × BF 0.95 (magnetic) = 3,724 lm.
    // Tubes: 2 × 2,400 × 0.7 = 3,360 lm → 97 % and 90 %, inside the band.
    const typeA = product('ta', { form: 'linear-tube', tubeType: 'type-a', unitsPerFixture: 2, lumensPerUnit: 2400, wattsPerUnit: 15, distribution: 'direct-wide' });
    const typeB = { ...typeA, id: 'tb', tubeType: 'type-b' as const };
    const electronic = judged(t8('electronic'), [typeA], 'ta');
    expect(electronic.reasons).toEqual([]);
    expect(electronic.accepted).toBe(true);
    expect(electronic.notes.map((n) => n.code)).toContain('ballast-compatibility');
    expect(codes(judged(t8('magnetic'), [typeA], 'ta'))).toContain('tube-on-magnetic-ballast');
    const b = judged(t8('magnetic'), [typeB], 'tb');
    expect(b.accepted).toBe(true);
    const caution = b.notes.find((n) => n.code === 'ballast-bypass')!;
    expect(caution.safety).toBe(true);
    expect(caution.message.endsWith(safetyDeferral)).toBe(true);
  });
});

describe('current proposal, changed flag and applying', () => {
  it('judges the current proposal the same way and says when the best differs', () => {
    const s = survey({ proposed: proposalFromProduct(lampB) });
    const e = chooseProducts(s, [lampA, lampB]).entries[0]!;
    expect(e.current?.productId).toBe('b');
    expect(e.current?.accepted).toBe(true);
    expect(e.current?.lifeCycleCostPerFixture).toBeCloseTo(45.850477, 5);
    expect(e.changed).toBe(true);
    const same = chooseProducts(survey({ proposed: proposalFromProduct(lampA) }), [lampA, lampB]).entries[0]!;
    expect(same.changed).toBe(false);
  });

  it('applyChoices changes only the listed entries, and nothing else', () => {
    const demo = demoSurvey();
    const before = structuredClone(demo);
    const choice = chooseProducts(demo, exampleCatalog);
    const target = choice.entries.find((e) => e.changed)!;
    const applied = applyChoices(demo, choice, [target.entryId]);
    expect(demo).toEqual(before); // input untouched
    for (const [ri, room] of applied.rooms.entries()) {
      for (const [ei, entry] of room.entries.entries()) {
        const old = before.rooms[ri]!.entries[ei]!;
        if (entry.id === target.entryId) {
          expect(entry.proposed).toEqual(target.best!.proposal);
          expect(entry.proposed?.catalogId).toBe(target.best!.productId);
          expect({ ...entry, proposed: null }).toEqual({ ...old, proposed: null });
        } else {
          expect(entry).toEqual(old);
        }
      }
    }
    expect({ ...applied, rooms: [] }).toEqual({ ...before, rooms: [] });
    // After applying, the entry's best is its current proposal.
    expect(chooseProducts(applied, exampleCatalog).entries.find((e) => e.entryId === target.entryId)?.changed).toBe(false);
    expect(() => applyChoices({ ...demo, id: 'other' }, choice, [])).toThrow(/was made for survey/);
    expect(() => applyChoices(demo, choice, ['nope'])).toThrow(/not in the choice/);
  });

  it('names the field when the survey cannot be calculated', () => {
    const bad = survey({ count: -1 });
    expect(() => chooseProducts(bad, [lampA])).toThrow('rooms[0].entries[0].count');
  });
});

describe('fit rules are the warnings’ rules', () => {
  it('ratingReasons agrees with ratingRules for every combination', () => {
    const bools = [false, true];
    for (const dimmer of ['none', 'leading-edge', '0-10v'] as const)
      for (const enclosed of bools)
        for (const location of ['dry', 'damp', 'wet'] as const)
          for (const emergencyCircuit of bools)
            for (const insulationContact of bools)
              for (const p of [lampA, product('all', { dimmable: true, enclosedRated: true, moistureRating: 'wet', emergencyListed: true, form: 'luminaire', insulationContactRated: true })]) {
                const c: FixtureConditions = { ...dry120, dimmer, enclosed, location, emergencyCircuit, insulationContact };
                const expected = [
                  ratingRules.dimmer(c, p) && 'not-dimmable',
                  ratingRules.enclosed(c, p) && 'not-enclosed-rated',
                  ratingRules.moisture(c, p) && 'moisture-rating',
                  ratingRules.emergency(c, p) && 'not-emergency-listed',
                  ratingRules.insulationLuminaire(c, p) && 'not-ic-rated',
                ].filter(Boolean);
                expect(ratingReasons(p, c).map((r) => r.code)).toEqual(expected);
              }
  });
});

describe('property: the chosen product is never rejected and none accepted is cheaper', () => {
  const arbProduct = fc.record({
    form: fc.constantFrom('screw-lamp', 'pin-lamp', 'linear-tube', 'luminaire', 'retrofit-kit' as const),
    tubeType: fc.constantFrom('not-a-tube', 'type-a', 'type-b', 'type-c', 'type-a-b' as const),
    lumensPerUnit: fc.integer({ min: 100, max: 5000 }),
    wattsPerUnit: fc.integer({ min: 2, max: 60 }),
    unitCost: fc.integer({ min: 1, max: 100 }),
    dimmable: fc.boolean(),
    enclosedRated: fc.boolean(),
    moistureRating: fc.constantFrom('dry', 'damp', 'wet' as const),
    insulationContactRated: fc.boolean(),
    emergencyListed: fc.boolean(),
    cri: fc.constantFrom(70, 80, 90),
    cctKelvin: fc.constantFrom(2700, 3000, 4000),
    ratedLifeHours: fc.integer({ min: 5000, max: 60_000 }),
    retired: fc.boolean(),
  });
  const arbConditions = fc.record({
    enclosed: fc.boolean(),
    dimmer: fc.constantFrom('none', 'leading-edge', 'trailing-edge', '0-10v', 'unknown' as const),
    location: fc.constantFrom('dry', 'damp', 'wet' as const),
    emergencyCircuit: fc.boolean(),
    insulationContact: fc.boolean(),
    circuitVolts: fc.constantFrom(120, 277),
  });

  it('holds for random catalogs and fixtures', () => {
    fc.assert(
      fc.property(fc.array(arbProduct, { minLength: 1, maxLength: 12 }), arbConditions, fc.boolean(), (specs, conditions, critical) => {
        const catalog = specs.map((spec, i) => product(`p${i}`, spec));
        const s = survey({}, { colourCritical: critical }, conditions);
        const e = chooseProducts(s, catalog).entries[0]!;
        const accepted = e.candidates.filter((c) => c.accepted);
        if (e.best === null) return accepted.length === 0;
        const best = e.candidates.find((c) => c.productId === e.best!.productId)!;
        return best.accepted && best.reasons.length === 0 && accepted.every((c) => c.lifeCycleCost! >= e.best!.lifeCycleCost!);
      }),
      { numRuns: 200 },
    );
  });
});
