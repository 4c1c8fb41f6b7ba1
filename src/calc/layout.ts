/**
 * Repeated layouts: one surveyed unit standing for several built the same way.
 *
 * A survey with a `layout` describes one unit; the project covers
 * `unitCount` units. Units listed in `exceptions` differ: their fixture count
 * for an entry is the one recorded there (0 when that fixture needs no change
 * in that unit); every other unit has the surveyed counts. Everything that
 * scales with fixtures (watts, kWh, money, orders) therefore scales with
 * {@link fixturesAcrossUnits}; what belongs to one room (illuminance, power
 * density, circuit loads) stays per unit.
 */
import { CalcInputError } from './errors.ts';
import type { Survey } from '../survey/model.ts';

/**
 * Units the survey stands for: 1 without a layout.
 *
 * @example unitsOf({ layout: { unitCount: 12, exceptions: [] } }) //=> 12
 */
export function unitsOf(survey: Pick<Survey, 'layout'>): number {
  return survey.layout?.unitCount ?? 1;
}

/**
 * Fixtures of each entry across every unit of the layout, by entry id:
 * (units − differing units) × surveyed count + the count recorded for each
 * differing unit (the surveyed count when that unit does not list the entry).
 * Without a layout this is each entry's own count.
 *
 * Throws a {@link CalcInputError} naming the field when the layout lists more
 * differing units than units, a count that is not a whole number of 0 or
 * more, or an entry id that is not in the survey.
 *
 * @example
 * // 10 flats, one already converted (count 0 for entry "e1"):
 * fixturesAcrossUnits(surveyWith({ e1: 4 }, { unitCount: 10, exceptions: [{ entryCounts: [{ entryId: 'e1', count: 0 }] }] })).get('e1') //=> 36
 */
export function fixturesAcrossUnits(survey: Pick<Survey, 'rooms' | 'layout'>): Map<string, number> {
  const counts = new Map<string, number>();
  for (const room of survey.rooms) for (const entry of room.entries) counts.set(entry.id, entry.count);
  const layout = survey.layout;
  if (!layout) return counts;
  if (!Number.isInteger(layout.unitCount) || layout.unitCount < 1) {
    throw new CalcInputError('layout.unitCount', `must be a whole number of 1 or more (got ${layout.unitCount})`);
  }
  if (layout.exceptions.length > layout.unitCount) {
    throw new CalcInputError(
      'layout.exceptions',
      `lists ${layout.exceptions.length} differing units but the layout has only ${layout.unitCount} units`,
    );
  }
  const regularUnits = layout.unitCount - layout.exceptions.length;
  const totals = new Map<string, number>();
  for (const [entryId, count] of counts) totals.set(entryId, count * regularUnits);
  layout.exceptions.forEach((unit, unitIndex) => {
    const own = new Map<string, number>();
    unit.entryCounts.forEach((item, itemIndex) => {
      const field = `layout.exceptions[${unitIndex}].entryCounts[${itemIndex}]`;
      if (!counts.has(item.entryId)) throw new CalcInputError(`${field}.entryId`, `names no fixture entry of this survey (got "${item.entryId}")`);
      if (!Number.isInteger(item.count) || item.count < 0) {
        throw new CalcInputError(`${field}.count`, `must be a whole number of 0 or more (got ${item.count})`);
      }
      own.set(item.entryId, item.count);
    });
    for (const [entryId, count] of counts) totals.set(entryId, (totals.get(entryId) ?? 0) + (own.get(entryId) ?? count));
  });
  return totals;
}
