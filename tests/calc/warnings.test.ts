/**
 * Compatibility and safety warnings: every warning code fires on a small
 * fixture built for it and stays quiet on the near miss, with its severity,
 * its safety flag and the threshold's source named beside each check.
 *
 * Most fixtures go through the whole survey calculation (`calculateSurvey`)
 * so the facts the rules see are the ones the engine really computes; the
 * exact boundaries are also checked with direct calls to `entryWarnings`,
 * `roomWarnings` and `circuitWarning`, where the facts can be set exactly.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type {
  ExistingEquipment,
  FixtureConditions,
  FixtureEntry,
  ProposedProduct,
  Room,
  Survey,
} from '../../src/survey/model.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { calculateSurvey, type SurveyResult } from '../../src/calc/survey.ts';
import { defaultLumenBand } from '../../src/calc/lighting.ts';
import { lpdAllowanceWattsPerSquareMetre, targetLux } from '../../src/calc/spaces.ts';
import { squareFeetToSquareMetres } from '../../src/calc/units.ts';
import {
  circuitWarning,
  entryWarnings,
  roomWarnings,
  safetyDeferral,
  severityRank,
  warningThresholds,
  type EntryFacts,
  type RoomFacts,
  type Severity,
  type Warning,
  type WarningCode,
} from '../../src/calc/warnings.ts';

// ---------------------------------------------------------------------------
// Fixtures
// ---------------------------------------------------------------------------

/**
 * A clean baseline: one 60 W incandescent pendant (800 lm, the US DOE
 * lumen-equivalence figure for 60 W, in an open fitting taken as passing all
 * its light) swapped for a 9 W, 800 lm LED luminaire that is dimmable,
 * enclosed-rated, wet-rated, IC-rated and emergency-listed, with CRI 90 and
 * PF 0.95. The baseline survey produces no warning at all (checked below), so
 * each fixture changes only what its warning needs.
 */
const baseExisting: ExistingEquipment = {
  technology: 'incandescent',
  description: 'Pendant, 60 W A-lamp',
  lampsPerFixture: 1,
  ratedWattsPerLamp: 60,
  lumensPerLamp: 800,
  luminaireEfficiency: 1,
  ballast: 'none',
};

const baseConditions: FixtureConditions = {
  enclosed: false,
  dimmer: 'none',
  location: 'dry',
  emergencyCircuit: false,
  insulationContact: false,
  circuitVolts: 120,
};

const baseProduct: ProposedProduct = {
  name: 'Test luminaire 9 W 800 lm 3000 K',
  form: 'luminaire',
  tubeType: 'not-a-tube',
  unitsPerFixture: 1,
  wattsPerUnit: 9,
  lumensPerUnit: 800,
  cctKelvin: 3000,
  cri: 90,
  powerFactor: 0.95,
  dimmable: true,
  enclosedRated: true,
  moistureRating: 'wet',
  insulationContactRated: true,
  emergencyListed: true,
  ratedLifeHours: 50_000,
  distribution: 'diffuse',
  unitCost: 20,
  installMinutesPerFixture: 10,
  rebatePerFixture: 0,
};

/** Optional existing-equipment fields a fixture can remove from the baseline. */
type DroppableExistingField = 'fixtureInputWatts' | 'meteredWattsPerFixture' | 'lumensPerLamp' | 'ballastYear';

interface EntryOverrides {
  id?: string;
  count?: number;
  existing?: Partial<ExistingEquipment>;
  /** Fields removed after the overrides are applied (e.g. no fixture input watts known). */
  existingWithout?: readonly DroppableExistingField[];
  conditions?: Partial<FixtureConditions>;
  /** `null` logs the entry without a proposal. */
  proposed?: Partial<ProposedProduct> | null;
}

function makeEntry(overrides: EntryOverrides = {}): FixtureEntry {
  const existing: ExistingEquipment = { ...baseExisting, ...overrides.existing };
  for (const field of overrides.existingWithout ?? []) delete existing[field];
  return {
    id: overrides.id ?? 'entry-1',
    count: overrides.count ?? 1,
    existing,
    conditions: { ...baseConditions, ...overrides.conditions },
    proposed: overrides.proposed === null ? null : { ...baseProduct, ...overrides.proposed },
    control: 'none',
    notes: '',
  };
}

/**
 * A one-room survey. The room is a 6 m² lobby with the coefficient of
 * utilisation (0.8) and total light loss factor (1) fixed, so one baseline
 * fixture gives 800 × 0.8 / 6 ≈ 107 lux against the lobby's 10 fc (108 lux)
 * target, and 9 W / 6 m² is far under the lobby allowance. `roomOverrides`
 * replaces room fields, including `entries` for several entries.
 */
function makeSurvey(entryOverrides: EntryOverrides = {}, roomOverrides: Partial<Room> = {}): Survey {
  const room: Room = {
    id: 'room-1',
    name: 'Test room',
    spaceType: 'lobby',
    floor: { kind: 'area', squareMetres: 6 },
    ceilingHeightMetres: 3,
    workPlaneHeightMetres: 0.76,
    hours: { kind: 'annual', hoursPerYear: 3000 },
    colourCritical: false,
    photometry: { coefficientOfUtilisation: 0.8, lightLossFactor: 1 },
    entries: [makeEntry(entryOverrides)],
    notes: '',
    ...roomOverrides,
  };
  return {
    id: 'survey-1',
    name: 'Warning fixture',
    site: { name: 'Test site', address: 'Test address' },
    client: { name: 'Test client', contact: '' },
    preparedBy: 'Test',
    buildingType: 'office-small',
    heatingType: 'fossil',
    cooled: false,
    units: 'si',
    locale: 'en-US',
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
    savings: {},
    grid: { kind: 'egrid', subregion: 'RFCE' },
    rooms: [room],
    notes: '',
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
  };
}

function warningsOf(entryOverrides: EntryOverrides = {}, roomOverrides: Partial<Room> = {}): Warning[] {
  return calculateSurvey(makeSurvey(entryOverrides, roomOverrides)).warnings;
}

function codes(warnings: readonly Warning[]): WarningCode[] {
  return warnings.map((w) => w.code);
}

/** The one warning with `code` (fails the test when there is none or several). */
function only(warnings: readonly Warning[], code: WarningCode): Warning {
  const found = warnings.filter((w) => w.code === code);
  expect(found, `expected exactly one "${code}" in [${codes(warnings).join(', ')}]`).toHaveLength(1);
  return found[0]!;
}

/** Facts for a direct `entryWarnings` call: the baseline's facts unless overridden. */
function entryFacts(overrides: Partial<EntryFacts> = {}): EntryFacts {
  return {
    lumenRatio: 1,
    lumenBand: defaultLumenBand,
    ratedFixtureWatts: 60,
    meteredWattsPerFixture: null,
    wattsEstimated: false,
    existingWattsPerFixture: 60,
    proposedWattsPerFixture: 9,
    powerFactorFailure: null,
    hasMercury: false,
    pcbRisk: 'none',
    ...overrides,
  };
}

/** Facts for a direct `roomWarnings` call: on target and well within the allowance unless overridden. */
function roomFacts(overrides: Partial<RoomFacts> = {}): RoomFacts {
  return {
    proposedCctsKelvin: [3000],
    proposedLux: 100,
    targetLux: 100,
    proposedWattsPerSquareMetre: 5,
    allowanceWattsPerSquareMetre: 10,
    hasProposal: true,
    ...overrides,
  };
}

const plainRoom = { id: 'room-1', name: 'Test room', colourCritical: false } as const;

function direct(entryOverrides: EntryOverrides, facts: Partial<EntryFacts> = {}, colourCritical = false): Warning[] {
  return entryWarnings({ id: 'room-1', colourCritical }, makeEntry(entryOverrides), entryFacts(facts));
}

/** Fluorescent existing equipment: 2-lamp F40T12 on a magnetic ballast. */
const t12Magnetic: Partial<ExistingEquipment> = {
  technology: 'linear-t12',
  description: 'Strip, 2-lamp F40T12',
  lampsPerFixture: 2,
  ratedWattsPerLamp: 40,
  lumensPerLamp: 2650,
  ballast: 'magnetic',
  fixtureInputWatts: 94,
};

/** 4-lamp F32T8 troffer on an electronic ballast (a Colorado State University Extension 2017 table row). */
const t8Electronic: Partial<ExistingEquipment> = {
  technology: 'linear-t8',
  description: 'Troffer, 4-lamp F32T8',
  lampsPerFixture: 4,
  ratedWattsPerLamp: 32,
  lumensPerLamp: 2800,
  ballast: 'electronic',
};

/** Where each code fires; the type makes the compiler insist on a fixture for every WarningCode. */
const firingFixtures: Record<WarningCode, () => Warning[]> = {
  'dimmer-non-dimmable': () => warningsOf({ conditions: { dimmer: 'trailing-edge' }, proposed: { dimmable: false } }),
  'dimmer-compatibility': () => warningsOf({ conditions: { dimmer: 'leading-edge' } }),
  'enclosed-not-rated': () => warningsOf({ conditions: { enclosed: true }, proposed: { enclosedRated: false } }),
  'moisture-not-rated': () => warningsOf({ conditions: { location: 'wet' }, proposed: { moistureRating: 'damp' } }),
  'emergency-circuit': () => warningsOf({ conditions: { emergencyCircuit: true }, proposed: { emergencyListed: false } }),
  'insulation-contact': () => warningsOf({ conditions: { insulationContact: true }, proposed: { insulationContactRated: false } }),
  'ballast-bypass': () => warningsOf({ existing: t8Electronic, proposed: { form: 'linear-tube', tubeType: 'type-b', unitsPerFixture: 4 } }),
  'fixture-rewired': () => warningsOf({ existing: t8Electronic, proposed: { form: 'linear-tube', tubeType: 'type-c', unitsPerFixture: 4 } }),
  'ballast-compatibility': () => warningsOf({ existing: t8Electronic, proposed: { form: 'linear-tube', tubeType: 'type-a', unitsPerFixture: 4 } }),
  'pcb-ballast': () => warningsOf({ existing: { ...t12Magnetic, ballastYear: 1979 } }),
  'pcb-ballast-unknown': () => warningsOf({ existing: t12Magnetic }),
  'mercury-lamps': () => warningsOf({ existing: t8Electronic }),
  'low-cri': () => warningsOf({ proposed: { cri: 79 } }),
  'mixed-cct': () =>
    warningsOf({}, { entries: [makeEntry({ id: 'a', proposed: { cctKelvin: 3000 } }), makeEntry({ id: 'b', proposed: { cctKelvin: 4000 } })] }),
  'lumens-short': () => warningsOf({ proposed: { lumensPerUnit: 600 } }),
  'lumens-over': () => warningsOf({ proposed: { lumensPerUnit: 1200 } }),
  'illuminance-short': () => warningsOf({}, { floor: { kind: 'area', squareMetres: 9 } }),
  'illuminance-over': () => warningsOf({}, { floor: { kind: 'area', squareMetres: 3 } }),
  'lpd-over': () => warningsOf({ proposed: { wattsPerUnit: 80 } }),
  'metered-vs-rated': () => warningsOf({ existing: { meteredWattsPerFixture: 75 } }),
  'watts-estimated': () => warningsOf({ existing: { ...t12Magnetic, ballastYear: 1990 }, existingWithout: ['fixtureInputWatts'] }),
  'circuit-overloaded': () => warningsOf({ count: 33, conditions: { circuitLabel: 'Panel B / 14', breakerAmps: 20 } }, { floor: { kind: 'area', squareMetres: 200 } }),
  'low-power-factor': () => warningsOf({ proposed: { powerFactor: 0.5 } }),
  'more-watts': () => warningsOf({ proposed: { wattsPerUnit: 61 } }),
};

// ---------------------------------------------------------------------------
// Baseline
// ---------------------------------------------------------------------------

describe('baseline fixture', () => {
  it('produces no warning at all, so each near miss below is a real near miss', () => {
    const result = calculateSurvey(makeSurvey());
    expect(result.warnings).toEqual([]);
    // The facts the near misses rely on: the table row for a 60 W incandescent lamp (input = rated watts)
    const entry = result.rooms[0]!.entries[0]!;
    expect(entry.existing.wattsPerFixture).toBe(60); // lamp label: incandescent input = rated watts
    expect(entry.wattsBasis).toBe('table');
    expect(entry.lumenRatio).toBe(1); // 800 lm luminaire for 800 lm of lamp light passing an open fitting
    // Lumen method E = N × lumens × CU × LLF / A = 800 × 0.8 × 1 / 6 (IES lumen method)
    expect(result.rooms[0]!.adequacy.proposedLux).toBeCloseTo((800 * 0.8) / 6, 9);
  });

  it('the lumen band is 0.85–1.3 (common practice, no published source)', () => {
    expect(defaultLumenBand).toEqual({ minRatio: 0.85, maxRatio: 1.3 }); // common practice, no published source
  });
});

// ---------------------------------------------------------------------------
// Entry warnings, each with its near miss
// ---------------------------------------------------------------------------

describe('dimmer-non-dimmable', () => {
  it('fires (caution, safety) for a non-dimmable product on a phase-cut or unknown dimmer', () => {
    for (const dimmer of ['leading-edge', 'trailing-edge', 'unknown'] as const) {
      const w = only(warningsOf({ conditions: { dimmer }, proposed: { dimmable: false } }), 'dimmer-non-dimmable');
      expect(w.severity).toBe('caution');
      expect(w.safety).toBe(true);
      expect(w.message).toContain(baseProduct.name);
    }
  });

  it('near miss: a dimmable product on a trailing-edge dimmer, or a non-dimmable one on a plain switch', () => {
    expect(codes(warningsOf({ conditions: { dimmer: 'trailing-edge' }, proposed: { dimmable: true } }))).toEqual([]);
    expect(codes(warningsOf({ conditions: { dimmer: 'none' }, proposed: { dimmable: false } }))).toEqual([]);
  });
});

describe('dimmer-compatibility', () => {
  it('fires (advice) for a dimmable product on a leading-edge or unknown dimmer', () => {
    for (const dimmer of ['leading-edge', 'unknown'] as const) {
      const w = only(warningsOf({ conditions: { dimmer } }), 'dimmer-compatibility');
      expect(w.severity).toBe('advice');
      expect(w.safety).toBe(false);
    }
  });

  it('near miss: trailing-edge and 0-10 V dimmers, and no dimmer', () => {
    for (const dimmer of ['trailing-edge', '0-10v', 'none'] as const) {
      expect(codes(warningsOf({ conditions: { dimmer } }))).not.toContain('dimmer-compatibility');
    }
  });

  it('a non-dimmable product on a leading-edge dimmer gets the stronger warning only', () => {
    const found = codes(warningsOf({ conditions: { dimmer: 'leading-edge' }, proposed: { dimmable: false } }));
    expect(found).toContain('dimmer-non-dimmable');
    expect(found).not.toContain('dimmer-compatibility');
  });
});

describe('enclosed-not-rated', () => {
  it('fires (caution, safety) for a product not rated for a totally enclosed fixture', () => {
    const w = only(warningsOf({ conditions: { enclosed: true }, proposed: { enclosedRated: false } }), 'enclosed-not-rated');
    expect(w.severity).toBe('caution');
    expect(w.safety).toBe(true);
  });

  it('near miss: an enclosed-rated product in the enclosed fixture; an unrated one in an open fixture', () => {
    expect(codes(warningsOf({ conditions: { enclosed: true }, proposed: { enclosedRated: true } }))).toEqual([]);
    expect(codes(warningsOf({ conditions: { enclosed: false }, proposed: { enclosedRated: false } }))).toEqual([]);
  });
});

describe('moisture-not-rated', () => {
  it('a dry-rated product in a damp location: caution, safety', () => {
    const w = only(warningsOf({ conditions: { location: 'damp' }, proposed: { moistureRating: 'dry' } }), 'moisture-not-rated');
    expect(w.severity).toBe('caution');
    expect(w.safety).toBe(true);
  });

  it('a damp-rated product in a wet location: danger, safety', () => {
    const w = only(warningsOf({ conditions: { location: 'wet' }, proposed: { moistureRating: 'damp' } }), 'moisture-not-rated');
    expect(w.severity).toBe('danger');
    expect(w.safety).toBe(true);
  });

  it('a dry-rated product in a wet location: danger', () => {
    expect(only(warningsOf({ conditions: { location: 'wet' }, proposed: { moistureRating: 'dry' } }), 'moisture-not-rated').severity).toBe('danger');
  });

  it('near miss: a damp-rated product in a damp location; a wet-rated one anywhere', () => {
    expect(codes(warningsOf({ conditions: { location: 'damp' }, proposed: { moistureRating: 'damp' } }))).toEqual([]);
    for (const location of ['dry', 'damp', 'wet'] as const) {
      expect(codes(warningsOf({ conditions: { location }, proposed: { moistureRating: 'wet' } }))).toEqual([]);
    }
  });
});

describe('emergency-circuit', () => {
  it('fires (danger, safety) for a product not listed for emergency use on an emergency circuit', () => {
    const w = only(warningsOf({ conditions: { emergencyCircuit: true }, proposed: { emergencyListed: false } }), 'emergency-circuit');
    expect(w.severity).toBe('danger');
    expect(w.safety).toBe(true);
  });

  it('near miss: an emergency-listed product on the emergency circuit', () => {
    expect(codes(warningsOf({ conditions: { emergencyCircuit: true }, proposed: { emergencyListed: true } }))).toEqual([]);
  });
});

describe('insulation-contact', () => {
  it('a luminaire that is not IC-rated in contact with insulation: danger, safety', () => {
    const w = only(warningsOf({ conditions: { insulationContact: true }, proposed: { insulationContactRated: false } }), 'insulation-contact');
    expect(w.severity).toBe('danger');
    expect(w.safety).toBe(true);
  });

  it('a lamp in an existing housing in contact with insulation: caution (the housing may not be IC-rated)', () => {
    const w = only(
      warningsOf({ conditions: { insulationContact: true }, proposed: { form: 'screw-lamp', insulationContactRated: true } }),
      'insulation-contact',
    );
    expect(w.severity).toBe('caution');
    expect(w.safety).toBe(true);
  });

  it('near miss: an IC-rated luminaire in contact with insulation', () => {
    expect(codes(warningsOf({ conditions: { insulationContact: true }, proposed: { insulationContactRated: true } }))).toEqual([]);
  });
});

describe('ballast-bypass and ballast-compatibility', () => {
  const tube = (tubeType: ProposedProduct['tubeType']): EntryOverrides => ({
    existing: t8Electronic,
    proposed: { form: 'linear-tube', tubeType, unitsPerFixture: 4, lumensPerUnit: 2100, wattsPerUnit: 15 },
  });

  it('Type B and Type A/B tubes rewire the fixture: ballast-bypass, caution, safety', () => {
    for (const tubeType of ['type-b', 'type-a-b'] as const) {
      const w = only(warningsOf(tube(tubeType)), 'ballast-bypass');
      expect(w.severity).toBe('caution');
      expect(w.safety).toBe(true);
      // UL Type B: line voltage at the lampholders; single-ended wiring needs non-shunted holders
      expect(w.message).toMatch(/non-shunted/);
    }
  });

  it('near miss: a Type A tube on an electronic ballast gets ballast-compatibility (advice), not ballast-bypass', () => {
    const found = warningsOf(tube('type-a'));
    expect(codes(found)).not.toContain('ballast-bypass');
    const w = only(found, 'ballast-compatibility');
    expect(w.severity).toBe('advice');
    expect(w.safety).toBe(false);
  });

  it('a Type A tube on a magnetic ballast: ballast-compatibility, caution', () => {
    const w = only(
      warningsOf({ existing: { ...t12Magnetic, ballastYear: 1995 }, proposed: { form: 'linear-tube', tubeType: 'type-a', unitsPerFixture: 2 } }),
      'ballast-compatibility',
    );
    expect(w.severity).toBe('caution');
  });

  it('Type C tubes and retrofit kits rewire the fixture too: fixture-rewired, caution, safety', () => {
    // UL classification: Type C runs from a remote driver; B and C change the luminaire's wiring (REFERENCES, Linear LED tube types)
    const typeC = only(warningsOf(tube('type-c')), 'fixture-rewired');
    expect(typeC.safety).toBe(true);
    expect(typeC.severity).toBe('caution');
    const kit = only(
      warningsOf({ existing: t8Electronic, proposed: { form: 'retrofit-kit', tubeType: 'not-a-tube', lumensPerUnit: 6000, wattsPerUnit: 40 } }),
      'fixture-rewired',
    );
    expect(kit.message).toMatch(/conversion label/);
    // near miss: a kit in a fixture that had no ballast does not rewire a ballast circuit
    expect(codes(warningsOf({ existing: { technology: 'led', ballast: 'none' }, proposed: { form: 'retrofit-kit', tubeType: 'not-a-tube' } }))).not.toContain('fixture-rewired');
  });

  it('a non-dimmable product under a 0-10 V control only loses dimming: advice, not a hazard', () => {
    // common practice, no published source: 0-10 V control wiring does not chop the mains supply
    const w = only(warningsOf({ conditions: { dimmer: '0-10v' }, proposed: { dimmable: false } }), 'dimmer-non-dimmable');
    expect(w.severity).toBe('advice');
    expect(w.safety).toBe(false);
  });

  it('near miss: a luminaire (not a tube) gets neither', () => {
    const found = codes(warningsOf({ existing: t8Electronic, proposed: { lumensPerUnit: 7000, wattsPerUnit: 60 } }));
    expect(found).not.toContain('ballast-bypass');
    expect(found).not.toContain('ballast-compatibility');
  });
});

describe('pcb-ballast and pcb-ballast-unknown', () => {
  it('a magnetic ballast dated 1979 may contain PCBs: danger, safety (EPA 430-B-95-003; 40 CFR 761: through 1979)', () => {
    const w = only(warningsOf({ existing: { ...t12Magnetic, ballastYear: 1979 } }), 'pcb-ballast');
    expect(w.severity).toBe('danger');
    expect(w.safety).toBe(true);
    expect(w.message).toContain('1979');
    expect(w.action).toMatch(/40 CFR 761/);
  });

  it('near miss: a magnetic ballast dated 1980 raises neither PCB warning (EPA 430-B-95-003: through 1979)', () => {
    const found = codes(warningsOf({ existing: { ...t12Magnetic, ballastYear: 1980 } }));
    expect(found).not.toContain('pcb-ballast');
    expect(found).not.toContain('pcb-ballast-unknown');
  });

  it('fires on a logged entry with no proposal too: the ballast is there either way', () => {
    expect(codes(warningsOf({ existing: { ...t12Magnetic, ballastYear: 1975 }, proposed: null }))).toContain('pcb-ballast');
  });

  it('an undated magnetic ballast: pcb-ballast-unknown, advice, safety', () => {
    const w = only(warningsOf({ existing: t12Magnetic }), 'pcb-ballast-unknown');
    expect(w.severity).toBe('advice');
    expect(w.safety).toBe(true);
  });

  it('near miss: an undated electronic ballast, and no ballast at all', () => {
    const electronic = codes(warningsOf({ existing: t8Electronic }));
    expect(electronic).not.toContain('pcb-ballast');
    expect(electronic).not.toContain('pcb-ballast-unknown');
    const incandescent = codes(warningsOf({ existing: { ballastYear: 1970 } }));
    expect(incandescent).not.toContain('pcb-ballast');
    expect(incandescent).not.toContain('pcb-ballast-unknown');
  });

  it('direct: pcbRisk "likely" → pcb-ballast, "unknown" → pcb-ballast-unknown, "none" → nothing', () => {
    expect(codes(direct({}, { pcbRisk: 'likely' }))).toEqual(['pcb-ballast']);
    expect(codes(direct({}, { pcbRisk: 'unknown' }))).toEqual(['pcb-ballast-unknown']);
    expect(codes(direct({}, { pcbRisk: 'none' }))).toEqual([]);
  });
});

describe('mercury-lamps', () => {
  it('fires (advice) when fluorescent or HID lamps are removed', () => {
    for (const existing of [t8Electronic, { ...t12Magnetic, ballastYear: 1995 }]) {
      const w = only(warningsOf({ existing }), 'mercury-lamps');
      expect(w.severity).toBe('advice');
      expect(w.action).toMatch(/40 CFR 273/); // 40 CFR 273 universal waste rule — from memory (REFERENCES marks it "verify")
      expect(w.action).toMatch(/local rules/);
    }
    const hid = warningsOf({
      existing: { technology: 'metal-halide', description: 'High-bay, 400 W MH', lampsPerFixture: 1, ratedWattsPerLamp: 400, ballast: 'magnetic', ballastYear: 2005 },
      proposed: { wattsPerUnit: 150, lumensPerUnit: 21_000 },
    });
    expect(codes(hid)).toContain('mercury-lamps');
  });

  it('near miss: incandescent lamps removed; fluorescent lamps logged but not changed', () => {
    expect(codes(warningsOf())).not.toContain('mercury-lamps');
    expect(codes(warningsOf({ existing: t8Electronic, proposed: null }))).not.toContain('mercury-lamps');
  });
});

describe('low-cri', () => {
  it('colour-critical room: CRI 89 fires, CRI 90 does not (California Title 24 JA8: CRI ≥ 90)', () => {
    const critical: Partial<Room> = { colourCritical: true };
    const w = only(warningsOf({ proposed: { cri: 89 } }, critical), 'low-cri');
    expect(w.severity).toBe('advice');
    expect(w.message).toMatch(/CRI 89/);
    expect(codes(warningsOf({ proposed: { cri: 90 } }, critical))).toEqual([]);
    expect(warningThresholds.colourCriticalMinCri).toBe(90); // California Title 24 JA8 (2019): CRI ≥ 90
  });

  it('other rooms: CRI 79 fires, CRI 80 does not (ENERGY STAR Integral LED Lamps: CRI ≥ 80)', () => {
    only(warningsOf({ proposed: { cri: 79 } }), 'low-cri');
    expect(codes(warningsOf({ proposed: { cri: 80 } }))).toEqual([]);
    expect(codes(warningsOf({ proposed: { cri: 89 } }))).toEqual([]); // 89 is fine where colour is not critical
    expect(warningThresholds.generalMinCri).toBe(80); // ENERGY STAR Integral LED Lamps: CRI ≥ 80
  });
});

describe('lumens-short and lumens-over (band 0.85–1.3 of the present delivered lumens)', () => {
  // Baseline delivers 800 lm per fixture (800 lm lamp, open fitting); a luminaire is taken at its rated lumens.
  it('ratio 0.85 exactly (680 / 800) is inside the band; 679 / 800 is short (common practice, no published source)', () => {
    expect(codes(warningsOf({ proposed: { lumensPerUnit: 680 } }))).toEqual([]); // common practice, no published source
    const w = only(warningsOf({ proposed: { lumensPerUnit: 679 } }), 'lumens-short'); // common practice, no published source
    expect(w.severity).toBe('caution');
    expect(w.safety).toBe(false);
  });

  it('ratio 1.3 exactly (1040 / 800) is inside the band; 1041 / 800 is over (common practice, no published source)', () => {
    expect(codes(warningsOf({ proposed: { lumensPerUnit: 1040 } }))).toEqual([]); // common practice, no published source
    const w = only(warningsOf({ proposed: { lumensPerUnit: 1041 } }), 'lumens-over'); // common practice, no published source
    expect(w.severity).toBe('advice');
  });

  it('a lamp or tube loses the existing housing share; a luminaire does not', () => {
    // Existing 800 lm in a housing passing 70 %: 560 lm delivered. An 800 lm screw lamp in the same housing
    // delivers 560 lm (ratio 1); an 800 lm luminaire delivers 800 lm (ratio 1.43, over).
    const housing = { luminaireEfficiency: 0.7 };
    expect(codes(warningsOf({ existing: housing, proposed: { form: 'screw-lamp' } }))).not.toContain('lumens-over');
    expect(codes(warningsOf({ existing: housing }))).toContain('lumens-over');
  });

  it('no lumen warning when the existing lumens are unknown', () => {
    // A T8 without lamp lumens: the ratio cannot be formed
    const found = codes(warningsOf({ existing: t8Electronic, existingWithout: ['lumensPerLamp'], proposed: { lumensPerUnit: 10 } }));
    expect(found).not.toContain('lumens-short');
  });

  it('property: short exactly when ratio < 0.85, over exactly when ratio > 1.3 (common practice, no published source)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 3, noNaN: true }), (ratio) => {
        const found = codes(direct({}, { lumenRatio: ratio }));
        expect(found.includes('lumens-short')).toBe(ratio < 0.85);
        expect(found.includes('lumens-over')).toBe(ratio > 1.3);
      }),
    );
  });
});

describe('low-power-factor (ENERGY STAR Lamps V2.0: PF ≥ 0.7 above 10 W, ≥ 0.6 at or below 10 W)', () => {
  const lamp = (wattsPerUnit: number, powerFactor: number): Warning[] =>
    warningsOf({ proposed: { form: 'screw-lamp', wattsPerUnit, powerFactor, lumensPerUnit: 800 } });

  it('an 11 W lamp at PF 0.69 fires (advice); at PF 0.70 it does not (ENERGY STAR Lamps V2.0: ≥ 0.7 above 10 W)', () => {
    const w = only(lamp(11, 0.69), 'low-power-factor'); // ENERGY STAR Lamps V2.0
    expect(w.severity).toBe('advice');
    expect(w.message).toContain('0.7');
    expect(w.message).toMatch(/ENERGY STAR Lamps V2\.0/);
    expect(codes(lamp(11, 0.7))).not.toContain('low-power-factor'); // ENERGY STAR Lamps V2.0
  });

  it('a 10 W lamp at PF 0.59 fires; at PF 0.60 and 0.65 it does not (ENERGY STAR Lamps V2.0: ≥ 0.6 at or below 10 W)', () => {
    expect(only(lamp(10, 0.59), 'low-power-factor').message).toContain('0.6'); // ENERGY STAR Lamps V2.0
    expect(codes(lamp(10, 0.6))).not.toContain('low-power-factor'); // ENERGY STAR Lamps V2.0
    expect(codes(lamp(10, 0.65))).not.toContain('low-power-factor'); // ENERGY STAR Lamps V2.0: 10 W is "at or below"
    expect(codes(lamp(10.01, 0.65))).toContain('low-power-factor'); // ENERGY STAR Lamps V2.0: just above 10 W needs 0.7
  });

  it('a luminaire below PF 0.9 fires (DesignLights Consortium SSL V5.1: PF ≥ 0.90 — from memory, verify)', () => {
    expect(codes(warningsOf({ proposed: { powerFactor: 0.89 } }))).toContain('low-power-factor'); // DLC SSL V5.1, from memory
    expect(codes(warningsOf({ proposed: { powerFactor: 0.9 } }))).not.toContain('low-power-factor'); // DLC SSL V5.1, from memory
  });
});

describe('more-watts', () => {
  it('fires (caution) when the proposal draws more per fixture than the existing 60 W', () => {
    const w = only(warningsOf({ proposed: { wattsPerUnit: 61 } }), 'more-watts');
    expect(w.severity).toBe('caution');
    expect(w.message).toContain('61.0 W');
  });

  it('near miss: the same 60 W per fixture', () => {
    expect(codes(warningsOf({ proposed: { wattsPerUnit: 60 } }))).not.toContain('more-watts');
  });

  it('counts every unit in the fixture: 4 × 16 W tubes = 64 W against a 60 W fixture', () => {
    expect(codes(warningsOf({ proposed: { form: 'linear-tube', tubeType: 'type-c', unitsPerFixture: 4, wattsPerUnit: 16, lumensPerUnit: 200 } }))).toContain('more-watts');
  });
});

describe('metered-vs-rated (more than 10 % off the rated figure; common practice, no published source)', () => {
  // Rated figure: the 100 W fixture input watts given on the entry.
  const metered = (meteredWattsPerFixture: number) => warningsOf({ existing: { fixtureInputWatts: 100, meteredWattsPerFixture } });

  it('10 % off either way does not fire', () => {
    expect(codes(metered(110))).toEqual([]); // common practice, no published source
    expect(codes(metered(90))).toEqual([]); // common practice, no published source
  });

  it('10.5 % off fires (advice), either way', () => {
    const high = only(metered(110.5), 'metered-vs-rated'); // common practice, no published source
    expect(high.severity).toBe('advice');
    expect(high.message).toContain('Measured 110.5 W against a rated 100.0 W');
    only(metered(89.5), 'metered-vs-rated'); // common practice, no published source
    expect(warningThresholds.meteredDeviationFraction).toBe(0.1);
  });

  it('against a table row: 60 W incandescent metered at 67 W (+11.7 %) fires, 66 W (+10 %) does not', () => {
    expect(codes(warningsOf({ existing: { meteredWattsPerFixture: 67 } }))).toContain('metered-vs-rated'); // common practice, no published source
    expect(codes(warningsOf({ existing: { meteredWattsPerFixture: 66 } }))).not.toContain('metered-vs-rated'); // common practice, no published source
  });

  it('property: fires exactly when |metered − rated| / rated > 0.1 (common practice, no published source)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1000, noNaN: true }), fc.double({ min: 0, max: 2000, noNaN: true }), (rated, meter) => {
        const found = codes(direct({}, { ratedFixtureWatts: rated, meteredWattsPerFixture: meter }));
        expect(found.includes('metered-vs-rated')).toBe(Math.abs((meter - rated) / rated) > 0.1);
      }),
    );
  });
});

describe('watts-estimated', () => {
  const noInput: EntryOverrides = { existing: { ...t12Magnetic, ballastYear: 1990 }, existingWithout: ['fixtureInputWatts'] };
  const withExisting = (more: Partial<ExistingEquipment>): EntryOverrides => ({ ...noInput, existing: { ...noInput.existing, ...more } });

  it('fires (advice) when no input watts, meter or table row is available for a ballasted fixture', () => {
    // 2-lamp F40T12 magnetic has no published row; the input is estimated
    const result = calculateSurvey(makeSurvey(noInput));
    expect(result.rooms[0]!.entries[0]!.wattsBasis).toBe('estimated');
    const w = only(result.warnings, 'watts-estimated');
    expect(w.severity).toBe('advice');
  });

  it('near miss: fixture input watts given; a published table row; a metered fixture', () => {
    expect(codes(warningsOf({ existing: { ...t12Magnetic, ballastYear: 1990 } }))).not.toContain('watts-estimated');
    // 4-lamp F40T12 magnetic, 172 W: Colorado State University Extension "Business Lighting 101" (2017)
    const fourLamp = calculateSurvey(makeSurvey(withExisting({ lampsPerFixture: 4 })));
    expect(fourLamp.rooms[0]!.entries[0]!.existing.wattsPerFixture).toBe(172);
    expect(codes(fourLamp.warnings)).not.toContain('watts-estimated');
    expect(codes(warningsOf(withExisting({ meteredWattsPerFixture: 86 })))).not.toContain('watts-estimated');
  });

  it('near miss: an incandescent lamp with no table row is taken at its rated watts, not estimated', () => {
    expect(codes(warningsOf({ existing: { ratedWattsPerLamp: 53, lumensPerLamp: 700 }, proposed: { lumensPerUnit: 700 } }))).toEqual([]);
  });
});

// ---------------------------------------------------------------------------
// Room warnings
// ---------------------------------------------------------------------------

describe('mixed-cct (spread above 300 K; common practice, no published source)', () => {
  const pair = (a: number, b: number, countB = 1) =>
    warningsOf({}, { entries: [makeEntry({ id: 'a', proposed: { cctKelvin: a } }), makeEntry({ id: 'b', count: countB, proposed: { cctKelvin: b } })] });

  it('a 301 K spread fires (advice); 300 K does not', () => {
    const w = only(pair(3000, 3301), 'mixed-cct'); // common practice, no published source
    expect(w.severity).toBe('advice');
    expect(w.roomId).toBe('room-1');
    expect(w.entryId).toBeUndefined();
    expect(codes(pair(3000, 3300))).not.toContain('mixed-cct'); // common practice, no published source
    expect(warningThresholds.mixedCctKelvin).toBe(300);
  });

  it('near miss: an entry with no fixtures or no proposal does not count', () => {
    expect(codes(pair(3000, 5000, 0))).not.toContain('mixed-cct');
    const logged = warningsOf({}, { entries: [makeEntry({ id: 'a' }), makeEntry({ id: 'b', proposed: null })] });
    expect(codes(logged)).not.toContain('mixed-cct');
  });
});

describe('illuminance-short and illuminance-over (0.8 and 1.5 × target; common practice, no published source)', () => {
  it('the lobby target is 10 fc (IES Lighting Handbook summary, lobby/reception)', () => {
    expect(targetLux('lobby')).toBeCloseTo(10 * 10.7639104, 6); // 1 fc = 1 lm/ft² = 10.7639 lux (definition)
  });

  it('fires (caution) when the room falls below 0.8 × target: 800 × 0.8 / 9 m² = 71 lux against 108 lux', () => {
    const w = only(warningsOf({}, { floor: { kind: 'area', squareMetres: 9 } }), 'illuminance-short');
    expect(w.severity).toBe('caution');
    expect(w.message).toContain('71 lx');
  });

  it("states light levels and power densities in the survey's units system", () => {
    // 1 fc = 10.764 lx (IES definition); 90.1-2019 allowances are published in W/ft²
    const facts = roomFacts({ proposedLux: 50, proposedWattsPerSquareMetre: 20 });
    const imperial = roomWarnings(plainRoom, facts, 'imperial');
    expect(only(imperial, 'illuminance-short').message).toContain(`${Math.round(50 / 10.7639104)} fc`);
    expect(only(imperial, 'lpd-over').message).toMatch(/W\/ft²/);
    expect(only(roomWarnings(plainRoom, facts, 'si'), 'lpd-over').message).toMatch(/20\.00 W\/m²/);
  });

  it('fires (advice) above 1.5 × target: 800 × 0.8 / 3 m² = 213 lux against 108 lux', () => {
    const w = only(warningsOf({}, { floor: { kind: 'area', squareMetres: 3 } }), 'illuminance-over');
    expect(w.severity).toBe('advice');
  });

  it('direct: 0.8 and 1.5 × target exactly do not fire; 0.79 and 1.51 do', () => {
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedLux: 80 })))).toEqual([]); // common practice, no published source
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedLux: 150 })))).toEqual([]); // common practice, no published source
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedLux: 79 })))).toEqual(['illuminance-short']); // common practice
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedLux: 151 })))).toEqual(['illuminance-over']); // common practice
  });

  it('near miss: no proposal in the room, or lux unknown', () => {
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedLux: 10, hasProposal: false })))).toEqual([]);
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedLux: null })))).toEqual([]);
  });
});

describe('lpd-over (ASHRAE/IES 90.1-2019 Table 9.6.1, space-by-space)', () => {
  // A 100 ft² enclosed office: allowance 0.74 W/ft² × 100 ft² = 74 W.
  const office: Partial<Room> = {
    spaceType: 'office-enclosed',
    floor: { kind: 'area', squareMetres: squareFeetToSquareMetres(100) },
    photometry: { coefficientOfUtilisation: 0.8, lightLossFactor: 1 },
  };

  it('the allowance used is 0.74 W/ft² (ASHRAE/IES 90.1-2019 Table 9.6.1, office enclosed ≤ 250 ft²)', () => {
    const r = calculateSurvey(makeSurvey({}, office)).rooms[0]!;
    expect(r.adequacy.allowanceWattsPerSquareFoot).toBeCloseTo(0.74, 10); // ASHRAE/IES 90.1-2019 Table 9.6.1
    expect(lpdAllowanceWattsPerSquareMetre('office-enclosed')).toBeCloseTo(0.74 * 10.7639104, 6); // × 10.764 W/m² per W/ft²
  });

  it('75 W in 100 ft² (0.75 W/ft²) fires (caution); 73 W (0.73 W/ft²) does not', () => {
    const w = only(warningsOf({ proposed: { wattsPerUnit: 75, lumensPerUnit: 6000 } }, office), 'lpd-over'); // ASHRAE/IES 90.1-2019 Table 9.6.1
    expect(w.severity).toBe('caution');
    expect(w.message).toMatch(/ASHRAE\/IES 90\.1-2019/);
    expect(codes(warningsOf({ proposed: { wattsPerUnit: 73, lumensPerUnit: 6000 } }, office))).not.toContain('lpd-over'); // ASHRAE/IES 90.1-2019 Table 9.6.1
  });

  it('direct: exactly at the allowance does not fire, above it does', () => {
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedWattsPerSquareMetre: 10 })))).toEqual([]); // ASHRAE/IES 90.1-2019: "allowance" is a maximum
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedWattsPerSquareMetre: 10.01 })))).toEqual(['lpd-over']);
  });

  it('near miss: a room with nothing proposed is not judged', () => {
    expect(codes(roomWarnings(plainRoom, roomFacts({ proposedWattsPerSquareMetre: 50, hasProposal: false })))).toEqual([]);
  });
});

// ---------------------------------------------------------------------------
// Circuits
// ---------------------------------------------------------------------------

describe('circuit-overloaded (NEC 210.20(A): continuous load ≤ 80 % of the breaker)', () => {
  const onCircuit = { circuitLabel: 'Panel B / 14', breakerAmps: 20 };
  const bigRoom: Partial<Room> = { floor: { kind: 'area', squareMetres: 200 } };

  it('32 × 60 W at 120 V, PF 1 = 16.0 A on a 20 A breaker (exactly 80 %) does not fire', () => {
    const result = calculateSurvey(makeSurvey({ count: 32, conditions: onCircuit }, bigRoom));
    expect(result.circuits.existing[0]!.amps).toBe(16); // I = P / (V × PF) = 1920 / 120
    expect(codes(result.warnings)).not.toContain('circuit-overloaded'); // NEC 210.20(A): 80 % is allowed
  });

  it('33 × 60 W = 16.5 A fires on the existing side: danger, safety', () => {
    const result = calculateSurvey(makeSurvey({ count: 33, conditions: onCircuit }, bigRoom));
    const w = only(result.warnings, 'circuit-overloaded'); // NEC 210.20(A)
    expect(w.severity).toBe('danger');
    expect(w.safety).toBe(true);
    expect(w.circuitLabel).toBe('Panel B / 14');
    expect(w.message).toContain('16.5 A (existing)');
  });

  it('flags the proposed side on its own: 20 × 100 W at PF 0.95 = 17.5 A against 10 A existing', () => {
    const result = calculateSurvey(
      makeSurvey({ count: 20, conditions: onCircuit, proposed: { wattsPerUnit: 100, powerFactor: 0.95, lumensPerUnit: 9000 } }, bigRoom),
    );
    const w = only(result.warnings, 'circuit-overloaded'); // NEC 210.20(A); I = P / (PF × V) = 2000 / 0.95 / 120
    expect(w.message).toContain('(proposed)');
    expect(result.circuits.proposed[0]!.amps).toBeCloseTo(2000 / 0.95 / 120, 9);
  });

  it('sums entries that share a circuit: two 20-fixture entries (20 A) overload it, each alone (10 A) would not', () => {
    const entries = [makeEntry({ id: 'a', count: 20, conditions: onCircuit }), makeEntry({ id: 'b', count: 20, conditions: onCircuit })];
    expect(codes(calculateSurvey(makeSurvey({}, { ...bigRoom, entries })).warnings)).toContain('circuit-overloaded'); // NEC 210.20(A)
    expect(codes(warningsOf({ count: 20, conditions: onCircuit }, bigRoom))).not.toContain('circuit-overloaded');
  });

  it('near miss: no breaker rating known', () => {
    expect(codes(warningsOf({ count: 40, conditions: { circuitLabel: 'Panel B / 14' } }, bigRoom))).not.toContain('circuit-overloaded');
  });

  it('direct: circuitWarning carries the label, the side and the breaker', () => {
    const w = circuitWarning('B/14', 17.5, 20, 'proposed');
    expect(w.code).toBe('circuit-overloaded');
    expect(w.severity).toBe('danger');
    expect(w.circuitLabel).toBe('B/14');
    expect(w.message).toContain('17.5 A (proposed)');
    expect(w.message).toContain('80 %'); // NEC 210.20(A)
    expect(w.action.endsWith(safetyDeferral)).toBe(true);
  });
});

// ---------------------------------------------------------------------------
// Every code, safety and ordering
// ---------------------------------------------------------------------------

const expectedSeverity: Record<WarningCode, Severity> = {
  'dimmer-non-dimmable': 'caution',
  'dimmer-compatibility': 'advice',
  'enclosed-not-rated': 'caution',
  'moisture-not-rated': 'danger', // wet location; a damp one is caution (tested above)
  'emergency-circuit': 'danger',
  'insulation-contact': 'danger', // luminaire; a lamp in an existing housing is caution (tested above)
  'ballast-bypass': 'caution',
  'fixture-rewired': 'caution',
  'ballast-compatibility': 'advice', // electronic ballast; magnetic is caution (tested above)
  'pcb-ballast': 'danger',
  'pcb-ballast-unknown': 'advice',
  'mercury-lamps': 'advice',
  'low-cri': 'advice',
  'mixed-cct': 'advice',
  'lumens-short': 'caution',
  'lumens-over': 'advice',
  'illuminance-short': 'caution',
  'illuminance-over': 'advice',
  'lpd-over': 'caution',
  'metered-vs-rated': 'advice',
  'watts-estimated': 'advice',
  'circuit-overloaded': 'danger',
  'low-power-factor': 'advice',
  'more-watts': 'caution',
};

/** Wiring, heat and life-safety warnings (house rules: these defer to local codes and licensed electricians). */
const safetyCodes: readonly WarningCode[] = [
  'dimmer-non-dimmable',
  'enclosed-not-rated',
  'moisture-not-rated',
  'emergency-circuit',
  'insulation-contact',
  'ballast-bypass',
  'fixture-rewired',
  'pcb-ballast',
  'circuit-overloaded',
];

const allCodes = Object.keys(firingFixtures) as WarningCode[];

describe('every warning code', () => {
  it.each(allCodes)('%s fires on its fixture through calculateSurvey, with the expected severity', (code) => {
    const w = only(firingFixtures[code](), code);
    expect(w.severity).toBe(expectedSeverity[code]);
    expect(w.title.length).toBeGreaterThan(0);
    expect(w.message.length).toBeGreaterThan(0);
    expect(w.action.length).toBeGreaterThan(0);
    if (code === 'circuit-overloaded') {
      // A circuit can run through several rooms: it is labelled by circuit, not by room.
      expect(w.circuitLabel).toBe('Panel B / 14');
    } else {
      expect(w.roomId).toBe('room-1');
    }
  });

  it.each(safetyCodes)('%s is a safety warning', (code) => {
    expect(only(firingFixtures[code](), code).safety).toBe(true);
  });

  it('every safety warning ends with the deferral to local codes and a licensed electrician; no other warning does', () => {
    expect(safetyDeferral).toMatch(/local electrical and building codes/);
    expect(safetyDeferral).toMatch(/licensed electrician/);
    const all = [...allCodes.flatMap((code) => firingFixtures[code]()), ...calculateSurvey(demoSurvey()).warnings];
    expect(all.filter((w) => w.safety).length).toBeGreaterThanOrEqual(safetyCodes.length);
    for (const w of all) {
      expect(w.action.endsWith(safetyDeferral), `${w.code}: safety ${String(w.safety)}, action "${w.action}"`).toBe(w.safety);
    }
  });

  it('entry warnings carry the room and entry ids', () => {
    const w = only(firingFixtures['emergency-circuit'](), 'emergency-circuit');
    expect(w.entryId).toBe('entry-1');
    expect(w.roomId).toBe('room-1');
  });
});

describe('the demo survey', () => {
  const result: SurveyResult = calculateSurvey(demoSurvey());

  it('shows the wiring, heat, life-safety and waste warnings it was built for', () => {
    const found = new Set(codes(result.warnings));
    for (const code of [
      'dimmer-non-dimmable',
      'enclosed-not-rated',
      'moisture-not-rated',
      'emergency-circuit',
      'pcb-ballast',
      'ballast-bypass',
      'mercury-lamps',
    ] as const) {
      expect(found.has(code), `demo lacks ${code}`).toBe(true);
    }
  });

  it('the wet bathroom fitting with a damp-rated lamp is a danger; the 1978 basement ballast is a PCB danger', () => {
    const bath = result.warnings.find((w) => w.code === 'moisture-not-rated' && w.entryId === 'demo-flat1-bath-ceiling');
    expect(bath?.severity).toBe('danger');
    const pcb = result.warnings.find((w) => w.code === 'pcb-ballast');
    expect(pcb?.entryId).toBe('demo-basement-strips');
    expect(pcb?.message).toContain('1978');
  });

  it('lists warnings danger → caution → advice, survey order kept within a severity', () => {
    const ranks = result.warnings.map((w) => severityRank[w.severity]);
    for (let i = 1; i < ranks.length; i++) expect(ranks[i]!).toBeGreaterThanOrEqual(ranks[i - 1]!);
    expect(result.warnings.map((w) => w.severity)).toContain('danger');
    expect(result.warnings.map((w) => w.severity)).toContain('caution');
    expect(result.warnings.map((w) => w.severity)).toContain('advice');

    // In survey order the warnings are mixed (so the sort is doing work) …
    const inSurveyOrder = result.rooms.flatMap((r) => [...r.entries.flatMap((e) => e.warnings), ...r.warnings]);
    const surveyRanks = inSurveyOrder.map((w) => severityRank[w.severity]);
    expect(surveyRanks.some((rank, i) => i > 0 && rank < surveyRanks[i - 1]!)).toBe(true);
    // … and the sorted list is a stable sort of them (circuit warnings come after, within their severity).
    for (const severity of ['danger', 'caution', 'advice'] as const) {
      const expected = inSurveyOrder.filter((w) => w.severity === severity);
      const got = result.warnings.filter((w) => w.severity === severity && w.circuitLabel === undefined);
      expect(got).toEqual(expected);
    }
    expect(result.warningCounts.danger + result.warningCounts.caution + result.warningCounts.advice).toBe(result.warnings.length);
  });
});
