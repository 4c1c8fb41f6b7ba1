/**
 * The store keeps rooms and entries flat, each with its parent's id and an
 * `order`; the rest of the app works with the nested `Survey`. These two pure
 * functions convert between the two, for backups, imports and for loading a
 * survey to calculate it.
 */
import type { FixtureEntry, Room, StoredEntry, StoredRoom, Survey, SurveyHeader } from './model.ts';

/** One survey as flat records. */
export interface SurveyRecords {
  survey: SurveyHeader;
  rooms: StoredRoom[];
  entries: StoredEntry[];
}

/**
 * Sort key of stored rooms and entries: `order`, then id so that equal orders stay stable.
 *
 * @example
 * [{ id: 'b', order: 1 }, { id: 'a', order: 1 }, { id: 'c', order: 0 }].sort(byOrder).map((r) => r.id) //=> ['c', 'a', 'b']
 */
export function byOrder(a: { order: number; id: string }, b: { order: number; id: string }): number {
  return a.order - b.order || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/**
 * A stored room without its survey id and order.
 *
 * @example
 * roomFields({ ...room, surveyId: 's1', order: 3 }) //=> room (without `entries`)
 */
export function roomFields(stored: StoredRoom): Omit<Room, 'entries'> {
  const { surveyId: _surveyId, order: _order, ...room } = stored;
  return room;
}

/**
 * A stored entry without its room id, survey id and order.
 *
 * @example
 * entryFields({ ...entry, roomId: 'r1', surveyId: 's1', order: 0 }) //=> entry
 */
export function entryFields(stored: StoredEntry): FixtureEntry {
  const { roomId: _roomId, surveyId: _surveyId, order: _order, ...entry } = stored;
  return entry;
}

/**
 * Splits a survey into the records the store keeps: rooms and entries numbered
 * 0, 1, 2… in their list order. The objects are new at the top level; nested
 * values (money, floor, existing equipment…) are shared with `survey`.
 *
 * @example
 * splitSurvey({ ...header, rooms: [{ ...room, id: 'r1', entries: [{ ...entry, id: 'e1' }] }] })
 * //=> { survey: header, rooms: [{ ...room, id: 'r1', surveyId: header.id, order: 0 }], entries: [{ ...entry, id: 'e1', roomId: 'r1', surveyId: header.id, order: 0 }] }
 */
export function splitSurvey(survey: Survey): SurveyRecords {
  const { rooms, ...header } = survey;
  const storedRooms: StoredRoom[] = [];
  const storedEntries: StoredEntry[] = [];
  rooms.forEach((room, roomIndex) => {
    const { entries, ...fields } = room;
    storedRooms.push({ ...fields, surveyId: survey.id, order: roomIndex });
    entries.forEach((entry, entryIndex) => {
      storedEntries.push({ ...entry, roomId: room.id, surveyId: survey.id, order: entryIndex });
    });
  });
  return { survey: header, rooms: storedRooms, entries: storedEntries };
}

/**
 * Builds the nested survey from its records: rooms in `order`, each with its
 * entries in `order`. Rooms of other surveys are ignored; entries whose room
 * is not among `rooms` are left out (they cannot be placed).
 *
 * @example
 * assembleSurvey(header, [{ ...room, id: 'r1', surveyId: header.id, order: 0 }], [{ ...entry, id: 'e1', roomId: 'r1', surveyId: header.id, order: 0 }])
 * //=> { ...header, rooms: [{ ...room, id: 'r1', entries: [{ ...entry, id: 'e1' }] }] }
 */
export function assembleSurvey(header: SurveyHeader, rooms: readonly StoredRoom[], entries: readonly StoredEntry[]): Survey {
  const byRoom = new Map<string, StoredEntry[]>();
  for (const entry of entries) {
    const list = byRoom.get(entry.roomId);
    if (list) list.push(entry);
    else byRoom.set(entry.roomId, [entry]);
  }
  const ownRooms = rooms.filter((room) => room.surveyId === header.id).sort(byOrder);
  return {
    ...header,
    rooms: ownRooms.map((room) => ({
      ...roomFields(room),
      entries: (byRoom.get(room.id) ?? []).sort(byOrder).map(entryFields),
    })),
  };
}

/**
 * `count` increasing sort keys strictly between `before` and `after` (null
 * means no neighbour on that side), or null when floating point has no room
 * left between them and the siblings must be renumbered first.
 *
 * @example
 * ordersBetween(1, 2, 3) //=> [1.25, 1.5, 1.75]
 */
export function ordersBetween(before: number | null, after: number | null, count: number): number[] | null {
  const out: number[] = [];
  if (before === null && after === null) for (let i = 0; i < count; i++) out.push(i);
  else if (before === null && after !== null) for (let i = count; i >= 1; i--) out.push(after - i);
  else if (after === null && before !== null) for (let i = 1; i <= count; i++) out.push(before + i);
  else if (before !== null && after !== null) {
    const step = (after - before) / (count + 1);
    for (let i = 1; i <= count; i++) out.push(before + step * i);
  }
  let previous = before ?? -Infinity;
  for (const value of out) {
    if (!(value > previous) || (after !== null && !(value < after)) || !Number.isFinite(value)) return null;
    previous = value;
  }
  return out;
}
