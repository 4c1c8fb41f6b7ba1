/**
 * Published facts per interior space type: the lighting power density a code
 * allows, the illuminance a space is usually lit to, the share of lighting
 * energy an occupancy sensor typically saves there, and whether colour
 * rendering usually matters.
 *
 * Sources (each row below says which one it uses):
 * - LPD: ASHRAE/IES Standard 90.1-2019, Table 9.6.1 (space-by-space method),
 *   values in W/ft² as transcribed in the project's reference notes.
 * - Illuminance: the IES Lighting Handbook (9th-edition era) summary of
 *   recommended footcandles. Rows not in the project's reference notes were
 *   read from public transcriptions: "IESNA FootCandle Recommendations"
 *   (one-page summary sheet; rows Hotels/Guest rooms, Residential/General,
 *   Restaurants/Food court-casual dining) and "Schools Lighting Levels"
 *   (IESNA Design Guide table; row Educational/Science laboratories). The US
 *   federal facilities rule 41 CFR 102-74.180 (50 fc workstations, 30 fc work
 *   areas, 10 fc non-work areas and storage) is used where it fits better.
 *   These are horizontal targets for judging adequacy, not design criteria.
 * - Occupancy-sensor savings: ASHRAE/IES 90.1-2019 Appendix G, Table G3.7
 *   where the project's reference notes list the space; elsewhere the row
 *   names the listed space it borrows from and why ("documented choice").
 *   Table G3.7 gives 0 where 90.1 already makes sensors mandatory; that is a
 *   modelling rule, not a measurement, so an auditor adding a sensor to such
 *   a room should enter their own fraction on the entry.
 */
import type { SpaceType } from '../survey/model.ts';
import { CalcInputError } from './errors.ts';
import { footcandlesToLux, wattsPerSquareFootToWattsPerSquareMetre } from './units.ts';

/** What Lampwalk knows about one space type. */
export interface SpaceFacts {
  /** Plain trade words for lists and reports. */
  label: string;
  /** LPD allowance, W/ft² (ASHRAE/IES 90.1-2019 Table 9.6.1). */
  lpdAllowanceWattsPerSquareFoot: number;
  /** Recommended average horizontal illuminance, footcandles. */
  targetFootcandles: number;
  /** Default fraction of lighting energy saved by an occupancy sensor, 0–0.9. */
  occupancySensorSavingsFraction: number;
  /** Suggested default for a room's `colourCritical` flag. */
  colourCritical: boolean;
}

const table = {
  'office-enclosed': {
    label: 'Office, enclosed (≤ 250 ft²)',
    lpdAllowanceWattsPerSquareFoot: 0.74, // 90.1-2019 Table 9.6.1, office enclosed ≤ 250 ft²
    targetFootcandles: 50, // IES summary "open/general office" 50 fc; 41 CFR 102-74.180 workstations 50 fc
    occupancySensorSavingsFraction: 0.3, // 90.1-2019 Table G3.7, private office
    colourCritical: false,
  },
  'office-open': {
    label: 'Office, open plan',
    lpdAllowanceWattsPerSquareFoot: 0.61, // 90.1-2019 Table 9.6.1, office open plan
    targetFootcandles: 50, // IES summary "open/general office" 50 fc (30 fc where computer work dominates)
    occupancySensorSavingsFraction: 0.15, // 90.1-2019 Table G3.7, open office (0.30 only with workstation sensors)
    colourCritical: false,
  },
  conference: {
    label: 'Conference / meeting room',
    lpdAllowanceWattsPerSquareFoot: 0.97, // 90.1-2019 Table 9.6.1, conference/meeting/multipurpose
    targetFootcandles: 30, // IES summary "conference" 30 fc
    // 90.1-2019 Table G3.7, conference: 0, because 90.1 already requires sensors
    // there (no modelling credit). Enter a fraction on the entry when the room
    // has no sensor today.
    occupancySensorSavingsFraction: 0,
    colourCritical: false,
  },
  corridor: {
    label: 'Corridor',
    lpdAllowanceWattsPerSquareFoot: 0.41, // 90.1-2019 Table 9.6.1, corridor
    targetFootcandles: 5, // IES summary "corridors/stairs" 5 fc
    occupancySensorSavingsFraction: 0.25, // 90.1-2019 Table G3.7, corridor
    colourCritical: false,
  },
  restroom: {
    label: 'Restroom',
    lpdAllowanceWattsPerSquareFoot: 0.63, // 90.1-2019 Table 9.6.1, restroom
    targetFootcandles: 10, // IES summary "toilets" 10 fc
    occupancySensorSavingsFraction: 0.45, // 90.1-2019 Table G3.7, restroom
    colourCritical: false,
  },
  stairwell: {
    label: 'Stairwell',
    lpdAllowanceWattsPerSquareFoot: 0.49, // 90.1-2019 Table 9.6.1, stairwell
    targetFootcandles: 5, // IES summary "corridors/stairs" 5 fc
    // Documented choice: stairwell not in the reference notes' G3.7 rows;
    // borrows the corridor row (circulation space, intermittent use).
    occupancySensorSavingsFraction: 0.25,
    colourCritical: false,
  },
  lobby: {
    label: 'Lobby',
    lpdAllowanceWattsPerSquareFoot: 0.84, // 90.1-2019 Table 9.6.1, lobby (all other)
    targetFootcandles: 10, // IES summary "lobby/reception" 10 fc
    // Documented choice: lobby not in the reference notes' G3.7 rows;
    // borrows the corridor row (circulation space).
    occupancySensorSavingsFraction: 0.25,
    colourCritical: false,
  },
  breakroom: {
    label: 'Break room / lounge',
    lpdAllowanceWattsPerSquareFoot: 0.59, // 90.1-2019 Table 9.6.1, lounge/breakroom
    // No break-room row in the reference notes; mapped to the IESNA summary
    // sheet row "Restaurants: food court/casual dining" 30 fc (eating and
    // kitchenette tasks). Verify against the Handbook.
    targetFootcandles: 30,
    // Documented choice: not in the reference notes' G3.7 rows; borrows the
    // private-office row (small room, intermittent use).
    occupancySensorSavingsFraction: 0.3,
    colourCritical: false,
  },
  classroom: {
    label: 'Classroom / lecture / training',
    lpdAllowanceWattsPerSquareFoot: 0.71, // 90.1-2019 Table 9.6.1, classroom/lecture/training
    targetFootcandles: 50, // IES summary "classroom" 50 fc
    // 90.1-2019 Table G3.7, classroom K-12: 0.30 (the "other classrooms" row is
    // 0 only because sensors are already mandatory there).
    occupancySensorSavingsFraction: 0.3,
    colourCritical: false,
  },
  'retail-sales': {
    label: 'Retail sales area',
    lpdAllowanceWattsPerSquareFoot: 1.05, // 90.1-2019 Table 9.6.1, retail sales area
    targetFootcandles: 50, // IES summary "general retail" 50 fc
    // Documented choice: not in the reference notes' G3.7 rows; a sales
    // floor is lit whenever the shop is open, so no default saving.
    occupancySensorSavingsFraction: 0,
    colourCritical: true, // merchandise display: colour rendering matters
  },
  storage: {
    label: 'Storage room (50–1,000 ft²)',
    lpdAllowanceWattsPerSquareFoot: 0.38, // 90.1-2019 Table 9.6.1, storage room 50–1,000 ft²
    targetFootcandles: 10, // 41 CFR 102-74.180, "non-work areas and storage" 10 fc
    // Documented choice: borrows the G3.7 warehouse-storage row (0.45),
    // the closest listed storage space.
    occupancySensorSavingsFraction: 0.45,
    colourCritical: false,
  },
  'warehouse-bulky': {
    label: 'Warehouse, bulky / palletised storage',
    lpdAllowanceWattsPerSquareFoot: 0.33, // 90.1-2019 Table 9.6.1, warehouse storage medium/bulky palletized
    targetFootcandles: 10, // IES summary "warehouse, large labels" 10 fc
    occupancySensorSavingsFraction: 0.45, // 90.1-2019 Table G3.7, warehouse storage
    colourCritical: false,
  },
  'warehouse-small-items': {
    label: 'Warehouse, small hand-carried items',
    lpdAllowanceWattsPerSquareFoot: 0.69, // 90.1-2019 Table 9.6.1, warehouse small hand-carried items
    targetFootcandles: 30, // IES summary "warehouse, small labels" 30 fc
    occupancySensorSavingsFraction: 0.45, // 90.1-2019 Table G3.7, warehouse storage
    colourCritical: false,
  },
  'parking-interior': {
    label: 'Parking area, interior',
    lpdAllowanceWattsPerSquareFoot: 0.15, // 90.1-2019 Table 9.6.1, parking area interior
    targetFootcandles: 5, // IES summary "indoor parking" 2–5 fc; upper end used
    // Documented choice: not in the reference notes' G3.7 rows; borrows the
    // warehouse-storage row (large area, visited intermittently).
    occupancySensorSavingsFraction: 0.45,
    colourCritical: false,
  },
  'food-preparation': {
    label: 'Food preparation',
    lpdAllowanceWattsPerSquareFoot: 1.09, // 90.1-2019 Table 9.6.1, food preparation
    targetFootcandles: 50, // IES summary "commercial kitchen" 50 fc
    // Documented choice: not in the reference notes' G3.7 rows; borrows the
    // open-office row (shared space, staffed through opening hours).
    occupancySensorSavingsFraction: 0.15,
    colourCritical: false,
  },
  dining: {
    label: 'Dining (cafeteria / fast food)',
    lpdAllowanceWattsPerSquareFoot: 0.4, // 90.1-2019 Table 9.6.1, dining cafeteria/fast food
    // No dining row in the reference notes; IESNA summary sheet row
    // "Restaurants: food court/casual dining" 30 fc. Verify against the Handbook.
    targetFootcandles: 30,
    // Documented choice: not in the reference notes' G3.7 rows; borrows the
    // open-office row (shared space, occupied through opening hours).
    occupancySensorSavingsFraction: 0.15,
    colourCritical: false,
  },
  laboratory: {
    label: 'Laboratory',
    lpdAllowanceWattsPerSquareFoot: 1.33, // 90.1-2019 Table 9.6.1, laboratory
    // No laboratory row in the reference notes; IESNA Design Guide
    // transcription "Educational facilities: science laboratories" 500 lux
    // (50 fc); agrees with 41 CFR 102-74.180 workstations 50 fc.
    targetFootcandles: 50,
    // Documented choice: not in the reference notes' G3.7 rows; borrows the
    // open-office row (shared bench space).
    occupancySensorSavingsFraction: 0.15,
    colourCritical: false,
  },
  gymnasium: {
    label: 'Gymnasium / fitness playing area',
    lpdAllowanceWattsPerSquareFoot: 0.85, // 90.1-2019 Table 9.6.1, gymnasium/fitness center playing area
    // No gymnasium row in the reference notes; recreational-class gymnasium
    // 30 fc as given in public summaries of IES sports lighting (school and
    // competition play needs more; from memory, verify against IES RP-6).
    targetFootcandles: 30,
    // Documented choice: not in the reference notes' G3.7 rows; borrows the
    // classroom K-12 row (scheduled, intermittent use).
    occupancySensorSavingsFraction: 0.3,
    colourCritical: false,
  },
  'guest-room': {
    label: 'Guest room (hotel / motel)',
    lpdAllowanceWattsPerSquareFoot: 0.41, // 90.1-2019 Table 9.6.1, guest room
    // No guest-room row in the reference notes; IESNA summary sheet row
    // "Hotels: guest rooms (general)" 10 fc.
    targetFootcandles: 10,
    // Documented choice: 0. Guest rooms are switched by their occupants (often
    // through key-card controls); hours of use already reflect occupancy.
    occupancySensorSavingsFraction: 0,
    colourCritical: false,
  },
  'dwelling-unit': {
    label: 'Dwelling unit (apartment)',
    lpdAllowanceWattsPerSquareFoot: 0.6, // 90.1-2019 Table 9.6.1, dwelling unit
    // No dwelling row in the reference notes; IESNA summary sheet row
    // "Residential: general lighting" 5 fc (task areas need more).
    targetFootcandles: 5,
    // Documented choice: 0. Homes are switched by their occupants; hours of
    // use already reflect occupancy.
    occupancySensorSavingsFraction: 0,
    colourCritical: false,
  },
} satisfies Record<SpaceType, SpaceFacts>;

for (const row of Object.values(table)) Object.freeze(row);

/** Facts for every {@link SpaceType}; see the file header for sources. */
export const spaceFacts: Record<SpaceType, SpaceFacts> = Object.freeze(table);

function factsFor(space: SpaceType): SpaceFacts {
  if (typeof space !== 'string' || !Object.hasOwn(spaceFacts, space)) {
    throw new CalcInputError('spaceType', `"${String(space)}" is not a known space type`);
  }
  return spaceFacts[space];
}

/**
 * ASHRAE/IES 90.1-2019 Table 9.6.1 LPD allowance for a space type, in W/m².
 *
 * @example lpdAllowanceWattsPerSquareMetre('office-open') //=> 6.5659… (0.61 W/ft²)
 */
export function lpdAllowanceWattsPerSquareMetre(space: SpaceType): number {
  return wattsPerSquareFootToWattsPerSquareMetre(factsFor(space).lpdAllowanceWattsPerSquareFoot);
}

/**
 * Recommended average horizontal illuminance for a space type, in lux.
 *
 * @example targetLux('conference') //=> 322.917… (30 fc)
 */
export function targetLux(space: SpaceType): number {
  return footcandlesToLux(factsFor(space).targetFootcandles);
}
