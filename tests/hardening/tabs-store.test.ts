/**
 * Two windows on the same survey, without a browser: two SurveyStore
 * instances on one database name (fake-indexeddb) stand for two tabs, and
 * two SurveySessions on them talk over Node's BroadcastChannel exactly as
 * tabs do.
 *
 * What must hold (the "Hardening" issue): no silent lost update. Edits to
 * different fields, made from views that are stale by the time they commit,
 * are all kept (each write carries only the fields it changed, applied to the
 * record as stored when it commits); for the same field the later write wins,
 * and the window whose value was replaced says so.
 * Common practice, no published source: per-field "last writer wins" is the
 * usual merge rule of offline-first record stores.
 */
import 'fake-indexeddb/auto';
import { afterAll, describe, expect, it, vi } from 'vitest';
import type { StoredEntry } from '../../src/survey/model.ts';
import { changeFields, openSurveyStore, startLampwalk, StoreError, type StoreChange, type SurveyStore } from '../../src/survey/store.ts';
import { entryFields } from '../../src/survey/records.ts';
import { entryCopy, SurveySession } from '../../src/ui/state/session.ts';
import { fakeEnvironment, uniqueName } from '../store/helpers.ts';

const entryId = 'demo-shop-troffers';
/** How long another tab may take to show a change (generous for a loaded CI machine). */
const settle = { timeout: 10_000 };
const tally = { differentFieldPairs: 0, sameFieldConflicts: 0, notices: 0, deletionNotices: 0, concurrentWrites: 0 };

/** Two "tabs": two stores on one database, the demo survey seeded. */
async function twoTabs(label: string): Promise<{ a: SurveyStore; b: SurveyStore; close: () => void }> {
  const databaseName = uniqueName(label);
  const { store: a } = await startLampwalk({ databaseName, environment: fakeEnvironment() });
  const b = await openSurveyStore({ databaseName, environment: fakeEnvironment() });
  return {
    a,
    b,
    close: () => {
      a.close();
      b.close();
    },
  };
}

afterAll(() => {
  console.log(
    `tabs (store and sessions): ${tally.differentFieldPairs} different-field edit pairs from stale views all kept, ` +
      `${tally.concurrentWrites} concurrent field writes all kept, ${tally.sameFieldConflicts} same-field conflicts won by the later write, ` +
      `${tally.notices} "changed in another window" notices, ${tally.deletionNotices} "survey deleted elsewhere" notice`,
  );
});

describe('the store merges per field', () => {
  it('different fields written from two stale views are both kept (top level and nested)', async () => {
    const { a, b, close } = await twoTabs('tabs-fields');
    try {
      // Both tabs read the entry first: from here on each one's view is stale once the other writes.
      const viewA = await a.getEntry(entryId);
      const viewB = await b.getEntry(entryId);
      expect(viewB).toEqual(viewA);

      await a.updateEntry(entryId, { count: 13 });
      await b.updateEntry(entryId, { notes: 'Lenses yellowed' });
      await a.updateEntry(entryId, { existing: changeFields({ lumensPerLamp: 2600 }) });
      await b.updateEntry(entryId, { existing: changeFields({ lampPrice: 4.5 }) });
      await a.updateEntry(entryId, { conditions: changeFields({ enclosed: true }) });
      await b.updateEntry(entryId, { conditions: changeFields({ breakerAmps: undefined }) });
      tally.differentFieldPairs += 3;

      const stored = await b.getEntry(entryId);
      expect(stored.count).toBe(13);
      expect(stored.notes).toBe('Lenses yellowed');
      expect(stored.existing.lumensPerLamp).toBe(2600);
      expect(stored.existing.lampPrice).toBe(4.5);
      // Fields neither tab touched are as they were.
      expect(stored.existing.ratedWattsPerLamp).toBe(viewA.existing.ratedWattsPerLamp);
      expect(stored.existing.meteredWattsPerFixture).toBe(viewA.existing.meteredWattsPerFixture);
      expect(stored.conditions.enclosed).toBe(true);
      expect('breakerAmps' in stored.conditions).toBe(false);
      expect(stored.conditions.circuitLabel).toBe(viewA.conditions.circuitLabel);

      // The room and the survey header work the same way.
      await a.updateRoom('demo-shop', { name: 'Shop floor (front)' });
      await b.updateRoom('demo-shop', { photometry: changeFields({ lightLossFactor: 0.8 }) });
      await a.updateSurvey('demo-tallowmere', { site: changeFields({ name: 'Tallowmere Corner, east block' }) });
      await b.updateSurvey('demo-tallowmere', { site: changeFields({ address: '9 Wicklight Row (invented address)' }) });
      tally.differentFieldPairs += 2;
      const room = await a.getRoom('demo-shop');
      expect(room).toMatchObject({ name: 'Shop floor (front)', photometry: { lightLossFactor: 0.8 } });
      expect((await a.getSurvey('demo-tallowmere')).site).toEqual({ name: 'Tallowmere Corner, east block', address: '9 Wicklight Row (invented address)' });
    } finally {
      close();
    }
  });

  it('a whole sub-object written from a stale view would lose the other tab’s change (why the screens send field changes)', async () => {
    const { a, b, close } = await twoTabs('tabs-whole');
    try {
      const stale = await b.getEntry(entryId);
      await a.updateEntry(entryId, { existing: changeFields({ lumensPerLamp: 2600 }) });
      // The old way: tab B sends its whole (stale) `existing` with one field changed.
      await b.updateEntry(entryId, { existing: { ...stale.existing, lampPrice: 4.5 } });
      const stored = await a.getEntry(entryId);
      expect(stored.existing.lampPrice).toBe(4.5);
      expect(stored.existing.lumensPerLamp).toBe(stale.existing.lumensPerLamp); // tab A's 2600 is gone
      expect(stored.existing.lumensPerLamp).not.toBe(2600);
    } finally {
      close();
    }
  });

  it('the same field: the later write wins', async () => {
    const { a, b, close } = await twoTabs('tabs-same');
    try {
      await a.updateEntry(entryId, { count: 12 });
      await b.updateEntry(entryId, { count: 7 });
      expect((await a.getEntry(entryId)).count).toBe(7);
      await b.updateEntry(entryId, { existing: changeFields({ lumensPerLamp: 2500 }) });
      await a.updateEntry(entryId, { existing: changeFields({ lumensPerLamp: 2900 }) });
      expect((await b.getEntry(entryId)).existing.lumensPerLamp).toBe(2900);
      tally.sameFieldConflicts += 2;
    } finally {
      close();
    }
  });

  it('interleaved writes started together from both tabs, 40 fields: every one is kept', async () => {
    const { a, b, close } = await twoTabs('tabs-concurrent');
    try {
      const fieldsA = ['cctKelvin', 'cri', 'lampLifeHours', 'powerFactor'] as const;
      const writes: Promise<StoredEntry>[] = [];
      const expected: Record<string, number> = {};
      for (let round = 0; round < 10; round++) {
        // Tab A changes `existing` fields, tab B the count and the conditions' voltage, all in flight together.
        const field = fieldsA[round % fieldsA.length] ?? 'cri';
        const value = field === 'powerFactor' ? 0.5 + round / 100 : field === 'cri' ? 70 + round : field === 'cctKelvin' ? 3000 + round * 100 : 20_000 + round * 1000;
        expected[field] = value;
        writes.push(a.updateEntry(entryId, { existing: changeFields({ [field]: value }) }));
        writes.push(b.updateEntry(entryId, { count: 100 + round }));
        writes.push(a.updateEntry(entryId, { notes: `round ${round}` }));
        writes.push(b.updateEntry(entryId, { conditions: changeFields({ circuitVolts: round % 2 === 0 ? 120 : 277 }) }));
      }
      await Promise.all(writes);
      tally.concurrentWrites += writes.length;
      const stored = await a.getEntry(entryId);
      for (const [field, value] of Object.entries(expected)) expect(stored.existing[field as keyof typeof stored.existing], field).toBe(value);
      expect(stored.count).toBe(109);
      expect(stored.notes).toBe('round 9');
      expect(stored.conditions.circuitVolts).toBe(277);
      expect(stored.existing.ratedWattsPerLamp).toBe(32);
    } finally {
      close();
    }
  });

  it('field changes are checked like any edit: a bad value is refused whole and nothing is written', async () => {
    const { a, close } = await twoTabs('tabs-invalid');
    try {
      const before = await a.getEntry(entryId);
      const negative = await a.updateEntry(entryId, { count: 3, existing: changeFields({ lumensPerLamp: -5 }) }).catch((error: unknown) => error);
      expect(negative).toBeInstanceOf(StoreError);
      expect((negative as StoreError).kind).toBe('invalid');
      expect((negative as StoreError).problems[0]?.path).toMatch(/existing\.lumensPerLamp/);
      // Hours switched to "per year" elsewhere, then a week-by-day change arrives: the mixture is refused, not stored.
      await a.updateRoom('demo-shop', { hours: { kind: 'annual', hoursPerYear: 4000 } });
      const mixed = await a.updateRoom('demo-shop', { hours: changeFields({ kind: 'weekly', weeksPerYear: 50 }) }).catch((error: unknown) => error);
      expect((mixed as StoreError).kind).toBe('invalid');
      expect((await a.getRoom('demo-shop')).hours).toEqual({ kind: 'annual', hoursPerYear: 4000 });
      expect(await a.getEntry(entryId)).toEqual(before);
    } finally {
      close();
    }
  });

  it('tells its listeners what each committed edit changed, and nothing for a refused one', async () => {
    const { a, close } = await twoTabs('tabs-notify');
    try {
      const heard: StoreChange[] = [];
      const stop = a.onChange((change) => heard.push(change));
      await a.updateEntry(entryId, { count: 2 });
      await a.updateRoom('demo-shop', { notes: 'x' });
      await a.updateSurvey('demo-tallowmere', { notes: 'y' });
      await a.addEntry('demo-shop', { ...entryCopy(entryFields(await a.getEntry(entryId))), count: 1 });
      await a.updateEntry(entryId, { count: -1 }).catch(() => undefined);
      stop();
      await a.updateEntry(entryId, { count: 4 });
      expect(heard).toEqual([
        { surveyId: 'demo-tallowmere', kind: 'entry', ids: [entryId] },
        { surveyId: 'demo-tallowmere', kind: 'room', ids: ['demo-shop'] },
        { surveyId: 'demo-tallowmere', kind: 'survey', ids: ['demo-tallowmere'] },
        { surveyId: 'demo-tallowmere', kind: 'layout', ids: [] },
      ]);
    } finally {
      close();
    }
  });
});

describe('two sessions (tabs) on one survey, over BroadcastChannel', () => {
  async function twoSessions(label: string) {
    const tabs = await twoTabs(label);
    const sessionA = await SurveySession.open(tabs.a, 'demo-tallowmere');
    const sessionB = await SurveySession.open(tabs.b, 'demo-tallowmere');
    const noticesA: string[] = [];
    const noticesB: string[] = [];
    sessionA.onOtherWindow((text) => noticesA.push(text));
    sessionB.onOtherWindow((text) => noticesB.push(text));
    return {
      ...tabs,
      sessionA,
      sessionB,
      noticesA,
      noticesB,
      close: () => {
        sessionA.dispose();
        sessionB.dispose();
        tabs.close();
      },
    };
  }
  const entryOf = (session: SurveySession) => session.findEntry(entryId)?.entry;

  it('each tab shows the other’s edits; different fields are all kept; the same field: the later wins and the tab that lost says so', async () => {
    const t = await twoSessions('tabs-sessions');
    try {
      // Different fields, one from each tab.
      expect(t.sessionA.updateEntry(entryId, { existing: changeFields({ lumensPerLamp: 2600 }) })).toBeNull();
      expect(t.sessionB.updateEntry(entryId, { notes: 'Two lenses cracked' })).toBeNull();
      await Promise.all([t.sessionA.flush(), t.sessionB.flush()]);
      await vi.waitFor(() => {
        expect(entryOf(t.sessionA)?.notes).toBe('Two lenses cracked');
        expect(entryOf(t.sessionB)?.existing.lumensPerLamp).toBe(2600);
      }, settle);
      tally.differentFieldPairs++;

      // The same field: B first, then A (later, wins).
      expect(t.sessionB.updateEntry(entryId, { count: 9 })).toBeNull();
      await t.sessionB.flush();
      await vi.waitFor(() => expect(entryOf(t.sessionA)?.count).toBe(9), settle);
      expect(t.noticesA).toEqual([]); // A had not edited the count: nothing of A's was replaced
      expect(t.sessionA.updateEntry(entryId, { count: 12 })).toBeNull();
      await t.sessionA.flush();
      await vi.waitFor(() => expect(entryOf(t.sessionB)?.count).toBe(12), settle);
      await vi.waitFor(() => expect(t.noticesB).toEqual(['Count was changed in another window: now 12.']), settle);
      tally.sameFieldConflicts++;
      tally.notices += t.noticesB.length;

      // The database holds both different-field edits and the later count; the calculated totals follow in the other tab.
      const stored = await t.b.getEntry(entryId);
      expect(stored).toMatchObject({ count: 12, notes: 'Two lenses cracked', existing: { lumensPerLamp: 2600 } });
      expect(t.sessionB.snapshot.result?.totals.fixtures).toBe(t.sessionA.snapshot.result?.totals.fixtures);
      expect(t.sessionB.snapshot.survey).toEqual(t.sessionA.snapshot.survey);
    } finally {
      t.close();
    }
  });

  it('a tab keeps the edit it has not saved yet over the other tab’s earlier change to that field, and then wins', async () => {
    const t = await twoSessions('tabs-pending');
    try {
      expect(t.sessionA.updateEntry(entryId, { existing: changeFields({ lampPrice: 5 }) })).toBeNull();
      await t.sessionA.flush();
      // Tab B: the remote change is read first, and B's own edit is made while that read is still queued.
      const reading = t.sessionB.applyChange({ surveyId: 'demo-tallowmere', kind: 'entry', ids: [entryId] });
      expect(t.sessionB.updateEntry(entryId, { existing: changeFields({ lampPrice: 6 }) })).toBeNull();
      expect(t.sessionB.updateEntry(entryId, { notes: 'typed in B' })).toBeNull();
      await reading;
      // B still shows its own price (saved after, so it wins) and the rest of A's entry.
      expect(entryOf(t.sessionB)?.existing.lampPrice).toBe(6);
      await t.sessionB.flush();
      expect((await t.a.getEntry(entryId)).existing.lampPrice).toBe(6);
      // A, whose 5 was replaced, is told.
      await vi.waitFor(() => expect(t.noticesA).toEqual(['Lamp price was changed in another window: now 6.']), settle);
      expect(t.noticesB).toEqual([]);
      tally.sameFieldConflicts++;
      tally.notices += t.noticesA.length;
    } finally {
      t.close();
    }
  });

  it('rooms, the survey header, structural changes and a deletion reach the other tab too', async () => {
    const t = await twoSessions('tabs-structure');
    try {
      expect(t.sessionA.updateRoom('demo-shop', { name: 'Shop floor (front)' })).toBeNull();
      expect(t.sessionA.updateSurvey({ client: changeFields({ contact: 'Caretaker' }) })).toBeNull();
      const added = await t.sessionA.addEntry('demo-shop', { ...entryCopy(entryFields(await t.a.getEntry(entryId))), count: 2 });
      await t.sessionA.flush();
      await vi.waitFor(() => {
        expect(t.sessionB.findRoom('demo-shop')?.name).toBe('Shop floor (front)');
        expect(t.sessionB.snapshot.survey.client.contact).toBe('Caretaker');
        expect(t.sessionB.findEntry(added.id)?.entry.count).toBe(2);
      }, settle);
      expect(t.sessionB.snapshot.result?.totals.entries).toBe(t.sessionA.snapshot.result?.totals.entries);
      expect(t.noticesB).toEqual([]);

      // The survey deleted in tab A: tab B is told rather than left editing a survey that is gone.
      await t.a.deleteSurvey('demo-tallowmere');
      await vi.waitFor(() => expect(t.noticesB).toEqual([expect.stringContaining('That survey is no longer on this device')]), settle);
      tally.deletionNotices += t.noticesB.length;
    } finally {
      t.close();
    }
  });
});
