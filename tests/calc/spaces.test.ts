import { describe, expect, it } from 'vitest';
import { lpdAllowanceWattsPerSquareMetre, spaceFacts, targetLux } from '../../src/calc/spaces.ts';
import { CalcInputError } from '../../src/calc/errors.ts';
import { footcandlesToLux } from '../../src/calc/units.ts';
import type { SpaceType } from '../../src/survey/model.ts';

const allSpaces: SpaceType[] = [
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
];

describe('spaceFacts', () => {
  it('has exactly one row per space type', () => {
    expect(Object.keys(spaceFacts).sort()).toEqual([...allSpaces].sort());
  });

  it('carries the ASHRAE/IES 90.1-2019 Table 9.6.1 LPD allowances', () => {
    // ASHRAE/IES 90.1-2019 Table 9.6.1, space-by-space method, W/ft²
    const published: Record<SpaceType, number> = {
      'office-enclosed': 0.74,
      'office-open': 0.61,
      conference: 0.97,
      corridor: 0.41,
      restroom: 0.63,
      stairwell: 0.49,
      lobby: 0.84,
      breakroom: 0.59,
      classroom: 0.71,
      'retail-sales': 1.05,
      storage: 0.38,
      'warehouse-bulky': 0.33,
      'warehouse-small-items': 0.69,
      'parking-interior': 0.15,
      'food-preparation': 1.09,
      dining: 0.4,
      laboratory: 1.33,
      gymnasium: 0.85,
      'guest-room': 0.41,
      'dwelling-unit': 0.6,
    };
    for (const space of allSpaces) {
      expect(spaceFacts[space].lpdAllowanceWattsPerSquareFoot).toBe(published[space]);
    }
  });

  it('carries the IES summary illuminance targets for the listed rows', () => {
    // IES Lighting Handbook (9th-ed. era) summary table, fc
    expect(spaceFacts['office-open'].targetFootcandles).toBe(50); // open/general office
    expect(spaceFacts.conference.targetFootcandles).toBe(30); // conference
    expect(spaceFacts.lobby.targetFootcandles).toBe(10); // lobby/reception
    expect(spaceFacts.restroom.targetFootcandles).toBe(10); // toilets
    expect(spaceFacts.corridor.targetFootcandles).toBe(5); // corridors/stairs
    expect(spaceFacts.stairwell.targetFootcandles).toBe(5); // corridors/stairs
    expect(spaceFacts.classroom.targetFootcandles).toBe(50); // classroom
    expect(spaceFacts['retail-sales'].targetFootcandles).toBe(50); // general retail
    expect(spaceFacts['food-preparation'].targetFootcandles).toBe(50); // commercial kitchen
    expect(spaceFacts['warehouse-bulky'].targetFootcandles).toBe(10); // warehouse, large labels
    expect(spaceFacts['warehouse-small-items'].targetFootcandles).toBe(30); // warehouse, small labels
    const parking = spaceFacts['parking-interior'].targetFootcandles; // indoor parking 2–5
    expect(parking).toBeGreaterThanOrEqual(2);
    expect(parking).toBeLessThanOrEqual(5);
    // 41 CFR 102-74.180: 10 fc non-work areas and storage
    expect(spaceFacts.storage.targetFootcandles).toBe(10);
    // IESNA summary sheet (public transcription): hotels, guest rooms (general) 10 fc
    expect(spaceFacts['guest-room'].targetFootcandles).toBe(10);
  });

  it('carries the Appendix G Table G3.7 occupancy-sensor fractions for the listed rows', () => {
    // ASHRAE/IES 90.1-2019 Appendix G, Table G3.7
    expect(spaceFacts['office-enclosed'].occupancySensorSavingsFraction).toBe(0.3); // private office
    expect(spaceFacts['office-open'].occupancySensorSavingsFraction).toBe(0.15); // open office
    expect(spaceFacts.restroom.occupancySensorSavingsFraction).toBe(0.45); // restroom
    expect(spaceFacts.corridor.occupancySensorSavingsFraction).toBe(0.25); // corridor
    expect(spaceFacts['warehouse-bulky'].occupancySensorSavingsFraction).toBe(0.45); // warehouse storage
    expect(spaceFacts['warehouse-small-items'].occupancySensorSavingsFraction).toBe(0.45); // warehouse storage
    expect(spaceFacts.classroom.occupancySensorSavingsFraction).toBe(0.3); // classroom K-12
    expect(spaceFacts.conference.occupancySensorSavingsFraction).toBe(0); // conference (sensors mandatory)
  });

  it('keeps every row within the ranges the rest of the engine accepts', () => {
    for (const space of allSpaces) {
      const row = spaceFacts[space];
      expect(row.label.length).toBeGreaterThan(0);
      expect(row.lpdAllowanceWattsPerSquareFoot).toBeGreaterThan(0);
      expect(row.targetFootcandles).toBeGreaterThan(0);
      // model.ts: controlSavingsFraction overrides lie in 0–0.9
      expect(row.occupancySensorSavingsFraction).toBeGreaterThanOrEqual(0);
      expect(row.occupancySensorSavingsFraction).toBeLessThanOrEqual(0.9);
    }
  });

  it('marks retail sales colour-critical by default', () => {
    expect(spaceFacts['retail-sales'].colourCritical).toBe(true);
    expect(spaceFacts.corridor.colourCritical).toBe(false);
  });

  it('cannot be changed by a caller', () => {
    expect(Object.isFrozen(spaceFacts)).toBe(true);
    expect(Object.isFrozen(spaceFacts.corridor)).toBe(true);
  });
});

describe('lpdAllowanceWattsPerSquareMetre', () => {
  it('converts the Table 9.6.1 figure to W/m²', () => {
    // ASHRAE/IES 90.1-2019 Table 9.6.1: open office 0.61 W/ft² × 10.7639 = 6.566 W/m²
    expect(lpdAllowanceWattsPerSquareMetre('office-open')).toBeCloseTo(6.5660, 3);
    // ASHRAE/IES 90.1-2019 Table 9.6.1: laboratory 1.33 W/ft² = 14.316 W/m²
    expect(lpdAllowanceWattsPerSquareMetre('laboratory')).toBeCloseTo(14.316, 3);
  });

  it('rejects an unknown space type naming the field', () => {
    const error = (() => {
      try {
        lpdAllowanceWattsPerSquareMetre('ballroom' as unknown as SpaceType);
      } catch (e) {
        return e;
      }
      return null;
    })();
    expect(error).toBeInstanceOf(CalcInputError);
    expect(error instanceof CalcInputError ? error.field : '').toBe('spaceType');
  });
});

describe('targetLux', () => {
  it('converts the IES footcandle targets to lux', () => {
    // IES summary: open/general office 50 fc = 538.2 lux; corridors 5 fc = 53.8 lux
    expect(targetLux('office-open')).toBeCloseTo(538.196, 3);
    expect(targetLux('corridor')).toBeCloseTo(53.82, 2);
    for (const space of allSpaces) {
      expect(targetLux(space)).toBeCloseTo(footcandlesToLux(spaceFacts[space].targetFootcandles), 12);
    }
  });

  it('rejects an unknown space type', () => {
    expect(() => targetLux('ballroom' as unknown as SpaceType)).toThrow(/spaceType/);
  });
});
