/**
 * Portfolios and repeated layouts in the store: the portfolio repository
 * (one transaction per edit, checked with the file schema and against the
 * stored surveys), what deleting a survey, room or entry does to portfolios
 * and layouts, backups with portfolios and layouts, and the schema-version-2
 * upgrade. Expected values are invented test data (common practice, no
 * published source).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it, vi } from 'vitest';
import { calculateLayout, calculatePortfolio } from '../../src/calc/portfolio.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { demoFlatEntryIds, demoPortfolio, demoSurvey } from '../../src/survey/demo.ts';
import type { RepeatedLayout } from '../../src/survey/model.ts';
import { changeFields, openSurveyStore, startLampwalk, type NewPortfolio, type PortfolioChange, type StoreChange, type SurveyStore } from '../../src/survey/store.ts';
import { PortfolioSession } from '../../src/ui/state/portfolioSession.ts';
import { dumpDatabase, writeFixtureDatabase, type DatabaseFixture } from './fixtures/harness.ts';
import { countTransactions, failure, fakeEnvironment, testClock, uniqueName } from './helpers.ts';

/** The demo plus a second survey ("Block B", one room, one entry), on a fresh database. */
async function twoSurveys(clock = testClock('2027-02-01T08:00:00.000Z')): Promise<{ store: SurveyStore; second: string; secondEntry: string }> {
  const { store } = await startLampwalk({ databaseName: uniqueName('portfolio'), environment: fakeEnvironment(), clock: clock.now, seedDemoPortfolio: false });
  const { rooms, id: _id, createdAt: _c, updatedAt: _u, ...fields } = demoSurvey();
  const survey = await store.createSurvey({ ...fields, name: 'Block B (invented)' });
  const { entries, id: _roomId, ...roomFields } = rooms[0]!;
  const room = await store.addRoom(survey.id, roomFields);
  const { id: _entryId, ...entryFields } = entries[0]!;
  const entry = await store.addEntry(room.id, entryFields);
  return { store, second: survey.id, secondEntry: entry.id };
}

function newPortfolio(surveyIds: string[]): NewPortfolio {
  return {
    name: 'Canal estate (invented)',
    client: { name: 'Example Housing (invented)', contact: 'Estates office' },
    surveyIds,
    plan: { budgetPerYear: 40_000, years: 4 },
    notes: '',
  };
}

const demoLayout: RepeatedLayout = {
  unitCount: 24,
  exceptions: [
    { id: 'flat-3b', unitLabel: 'Flat 3B', entryCounts: [{ entryId: 'demo-shop-troffers', count: 0 }, { entryId: 'demo-stair-bulkheads', count: 2 }], notes: 'Converted' },
    { id: 'flat-7a', unitLabel: 'Flat 7A', entryCounts: [{ entryId: 'demo-basement-strips', count: 1 }], notes: '' },
  ],
};

describe('the portfolio repository', () => {
  it('creates, lists, reads, changes and deletes a portfolio, one transaction each', async () => {
    const clock = testClock('2027-02-01T08:00:00.000Z');
    const { store, second } = await twoSurveys(clock);
    await store.whenIdle();
    clock.advanceDays(1);
    const created = await countTransactions(() => store.createPortfolio(newPortfolio(['demo-tallowmere', second])));
    expect(created.readwrite).toBe(1);
    expect(created.readonly).toBe(0);
    const portfolio = created.result;
    expect(portfolio.surveyIds).toEqual(['demo-tallowmere', second]);
    expect(portfolio.createdAt).toBe(portfolio.updatedAt);
    expect(await store.getPortfolio(portfolio.id)).toEqual(portfolio);

    clock.advanceDays(1);
    const other = await store.createPortfolio({ ...newPortfolio([second]), name: 'Second estate' });
    expect((await store.listPortfolios()).map((p) => p.id)).toEqual([other.id, portfolio.id]);

    clock.advanceDays(1);
    const updated = await countTransactions(() => store.updatePortfolio(portfolio.id, { surveyIds: [second, 'demo-tallowmere'], plan: { budgetPerYear: 10_000, years: 2 } }));
    expect(updated.readwrite).toBe(1);
    expect(updated.result.surveyIds).toEqual([second, 'demo-tallowmere']);
    expect(updated.result.createdAt).toBe(portfolio.createdAt);
    expect(Date.parse(updated.result.updatedAt)).toBeGreaterThan(Date.parse(portfolio.updatedAt));
    expect((await store.listPortfolios())[0]!.id).toBe(portfolio.id);

    const removed = await countTransactions(() => store.deletePortfolio(portfolio.id));
    expect(removed.readwrite).toBe(1);
    expect((await failure(store.getPortfolio(portfolio.id))).kind).toBe('not-found');
    expect((await failure(store.deletePortfolio(portfolio.id))).kind).toBe('not-found');
    // Its surveys stay.
    expect((await store.listSurveys()).length).toBe(2);
    store.close();
  });

  it('refuses a survey that is not stored, a survey listed twice and bad plan settings, writing nothing', async () => {
    const { store, second } = await twoSurveys();
    const missing = await failure(store.createPortfolio(newPortfolio(['demo-tallowmere', 'no-such-survey'])));
    expect(missing.kind).toBe('invalid');
    expect(missing.problems.map((p) => p.path)).toEqual(['surveyIds[1]']);
    expect(missing.message).toMatch(/not on this device/);
    const twice = await failure(store.createPortfolio(newPortfolio([second, second])));
    expect(twice.problems.map((p) => p.path)).toEqual(['surveyIds[1]']);
    const plan = await failure(store.createPortfolio({ ...newPortfolio([]), plan: { budgetPerYear: -5, years: 21 } }));
    expect(plan.problems.map((p) => p.path)).toEqual(['plan.budgetPerYear', 'plan.years']);
    expect(await store.listPortfolios()).toEqual([]);

    const portfolio = await store.createPortfolio(newPortfolio([second]));
    const bad = await failure(store.updatePortfolio(portfolio.id, { surveyIds: [second, 'gone'] }));
    expect(bad.problems.map((p) => p.path)).toEqual(['surveyIds[1]']);
    expect(await store.getPortfolio(portfolio.id)).toEqual(portfolio);
    expect((await failure(store.updatePortfolio('nope', { name: 'x' }))).kind).toBe('not-found');
    store.close();
  });

  it('deleting a survey takes it out of every portfolio in the same transaction; restoring it does not put it back', async () => {
    const { store, second } = await twoSurveys();
    const a = await store.createPortfolio(newPortfolio(['demo-tallowmere', second]));
    const b = await store.createPortfolio(newPortfolio([second]));
    const c = await store.createPortfolio(newPortfolio(['demo-tallowmere']));
    await store.whenIdle();
    const deleted = await countTransactions(() => store.deleteSurvey(second));
    expect(deleted.readwrite).toBe(1);
    expect((await store.getPortfolio(a.id)).surveyIds).toEqual(['demo-tallowmere']);
    expect((await store.getPortfolio(b.id)).surveyIds).toEqual([]);
    expect(await store.getPortfolio(c.id)).toEqual(c);
    await store.restoreFromTrash(deleted.result);
    expect((await store.getSurvey(second)).id).toBe(second);
    expect((await store.getPortfolio(a.id)).surveyIds).toEqual(['demo-tallowmere']);
    store.close();
  });
});

describe('repeated layouts in the store', () => {
  it('saves a layout patch checked against the stored entries, and the survey loads and calculates with it', async () => {
    const { store, secondEntry } = await twoSurveys();
    const saved = await store.updateSurvey('demo-tallowmere', { layout: demoLayout });
    expect(saved.layout).toEqual(demoLayout);
    const survey = await store.loadSurvey('demo-tallowmere');
    expect(survey.layout).toEqual(demoLayout);
    const layout = calculateLayout(survey);
    expect(layout.units).toBe(24);
    // demo: troffers 12 per unit, one unit has none → 23 × 12.
    expect(layout.fixturesByEntry.get('demo-shop-troffers')).toBe(23 * 12);

    // An entry of another survey, or none at all, is refused and nothing changes.
    const foreign = await failure(
      store.updateSurvey('demo-tallowmere', {
        layout: { unitCount: 3, exceptions: [{ id: 'u', unitLabel: 'U', entryCounts: [{ entryId: secondEntry, count: 1 }], notes: '' }] },
      }),
    );
    expect(foreign.kind).toBe('invalid');
    expect(foreign.problems.map((p) => p.path)).toEqual(['layout.exceptions[0].entryCounts[0].entryId']);
    const tooMany = await failure(store.updateSurvey('demo-tallowmere', { layout: { ...demoLayout, unitCount: 1 } }));
    expect(tooMany.problems.map((p) => p.path)).toEqual(['layout.exceptions']);
    expect((await store.getSurvey('demo-tallowmere')).layout).toEqual(demoLayout);

    // Removing the layout: a one-off building again.
    const plain = await store.updateSurvey('demo-tallowmere', { layout: undefined });
    expect(Object.hasOwn(plain, 'layout')).toBe(false);
    store.close();
  });

  it('a new survey cannot start with differing units that name entries', async () => {
    const { store } = await twoSurveys();
    const { rooms: _rooms, id: _id, createdAt: _c, updatedAt: _u, ...fields } = demoSurvey();
    const refused = await failure(store.createSurvey({ ...fields, layout: demoLayout }));
    expect(refused.problems[0]?.path).toBe('layout.exceptions[0].entryCounts[0].entryId');
    const ok = await store.createSurvey({ ...fields, layout: { unitCount: 12, exceptions: [] } });
    expect(ok.layout).toEqual({ unitCount: 12, exceptions: [] });
    store.close();
  });

  it('deleting an entry or a room, or moving an entry to another survey, takes it out of the layout; the survey still loads', async () => {
    const { store, second } = await twoSurveys();
    await store.updateSurvey('demo-tallowmere', { layout: demoLayout });
    await store.whenIdle();
    const entryDelete = await countTransactions(() => store.deleteEntry('demo-shop-troffers'));
    expect(entryDelete.readwrite).toBe(1);
    let layout = (await store.getSurvey('demo-tallowmere')).layout!;
    expect(layout.exceptions.map((unit) => unit.entryCounts.map((item) => item.entryId))).toEqual([['demo-stair-bulkheads'], ['demo-basement-strips']]);
    // The differing unit itself stays (label and notes are the landlord's).
    expect(layout.exceptions.map((unit) => unit.unitLabel)).toEqual(['Flat 3B', 'Flat 7A']);

    await store.deleteRoom('demo-basement');
    layout = (await store.getSurvey('demo-tallowmere')).layout!;
    expect(layout.exceptions[1]!.entryCounts).toEqual([]);

    const [secondRoom] = await store.listRooms(second);
    await store.moveEntry('demo-stair-bulkheads', secondRoom!.id);
    layout = (await store.getSurvey('demo-tallowmere')).layout!;
    expect(layout.exceptions[0]!.entryCounts).toEqual([]);

    const survey = await store.loadSurvey('demo-tallowmere');
    expect(calculateLayout(survey).units).toBe(24);
    expect((await store.loadSurvey(second)).rooms[0]!.entries.map((e) => e.id)).toContain('demo-stair-bulkheads');
    store.close();
  });
});

describe('backups with portfolios and layouts', () => {
  async function source(): Promise<{ store: SurveyStore; second: string; portfolioId: string }> {
    const { store, second } = await twoSurveys();
    await store.updateSurvey('demo-tallowmere', { layout: demoLayout });
    const portfolio = await store.createPortfolio(newPortfolio(['demo-tallowmere', second]));
    return { store, second, portfolioId: portfolio.id };
  }

  it('round trip: a full backup restores portfolios and layouts exactly, and the roll-up calculates the same', async () => {
    const { store, portfolioId } = await source();
    const backup = await store.exportEverything();
    expect(backup.file.version).toBe(3);
    expect(backup.file.portfolios.map((p) => p.id)).toEqual([portfolioId]);
    expect(backup.file.surveys.find((s) => s.id === 'demo-tallowmere')?.layout).toEqual(demoLayout);

    const target = await openSurveyStore({ databaseName: uniqueName('portfolio-restore'), environment: fakeEnvironment() });
    const preview = await target.previewImport(backup.text);
    expect(preview.portfolios).toBe(1);
    expect(preview.portfoliosAlreadyStored).toBe(0);
    expect(preview.needsChoice).toBe(false);
    const report = await target.importBackup(backup.text);
    expect(report.portfolioIds).toEqual([portfolioId]);
    expect(await target.listPortfolios()).toEqual(await store.listPortfolios());

    const portfolio = await target.getPortfolio(portfolioId);
    const before = calculatePortfolio(await store.getPortfolio(portfolioId), await Promise.all(portfolio.surveyIds.map((id) => store.loadSurvey(id))));
    const after = calculatePortfolio(portfolio, await Promise.all(portfolio.surveyIds.map((id) => target.loadSurvey(id))));
    expect(after.totals).toEqual(before.totals);
    expect(after.economics.netPresentValue).toBe(before.economics.netPresentValue);
    expect(after.sites[0]!.units).toBe(24);
    target.close();
    store.close();
  });

  it('a one-survey export carries its layout but no portfolio', async () => {
    const { store } = await source();
    const one = await store.exportSurvey('demo-tallowmere');
    expect(one.file.portfolios).toEqual([]);
    expect(one.file.surveys[0]!.layout).toEqual(demoLayout);
    store.close();
  });

  it('a portfolio already stored: refused, copied (members and layout counts follow the new ids), or replaced', async () => {
    const { store, second, portfolioId } = await source();
    const backup = await store.exportEverything();
    const preview = await store.previewImport(backup.text);
    expect(preview.portfoliosAlreadyStored).toBe(1);
    expect(preview.needsChoice).toBe(true);

    const refused = await failure(store.importBackup(backup.text));
    expect(refused.kind).toBe('conflict');
    expect(refused.message).toContain('Canal estate (invented)');

    const copy = await store.importBackup(backup.text, 'copy');
    expect(copy.portfolioIds).toHaveLength(1);
    expect(copy.portfolioIds[0]).not.toBe(portfolioId);
    const copied = await store.getPortfolio(copy.portfolioIds[0]!);
    expect(copied.name).toBe('Canal estate (invented) (copy)');
    expect(copied.surveyIds).toHaveLength(2);
    expect(copied.surveyIds.every((id) => copy.surveyIds.includes(id))).toBe(true);
    // The copied layout survey names its own (new) entries and calculates like the original.
    const copiedDemoId = copied.surveyIds[0]!;
    const copiedDemo = await store.loadSurvey(copiedDemoId);
    const ownEntries = new Set(copiedDemo.rooms.flatMap((r) => r.entries.map((e) => e.id)));
    expect(copiedDemo.layout!.exceptions.flatMap((u) => u.entryCounts.map((c) => c.entryId)).every((id) => ownEntries.has(id))).toBe(true);
    expect(calculateLayout(copiedDemo).totals.money.cost.net).toBeCloseTo(calculateLayout(await store.loadSurvey('demo-tallowmere')).totals.money.cost.net, 9);

    await store.updatePortfolio(portfolioId, { name: 'Renamed here', surveyIds: [second] });
    const replaced = await store.importBackup(backup.text, 'replace');
    expect(replaced.portfolioIds).toEqual([portfolioId]);
    const back = await store.getPortfolio(portfolioId);
    expect(back.name).toBe('Canal estate (invented)');
    expect(back.surveyIds).toEqual(['demo-tallowmere', second]);
    store.close();
  });

  it('a file whose portfolio names a survey that is not in it is refused whole', async () => {
    const { store } = await source();
    const backup = await store.exportEverything();
    const file = JSON.parse(backup.text) as { portfolios: { surveyIds: string[] }[] };
    file.portfolios[0]!.surveyIds.push('not-in-file');
    const target = await openSurveyStore({ databaseName: uniqueName('portfolio-bad'), environment: fakeEnvironment() });
    const refused = await failure(target.importBackup(JSON.stringify(file)));
    expect(refused.kind).toBe('invalid-file');
    expect(refused.problems.map((p) => p.path)).toEqual(['portfolios[0].surveyIds[2]']);
    expect(await target.listSurveys()).toEqual([]);
    target.close();
    store.close();
  });
});

describe('schema version 2', () => {
  function fixture(version: number): DatabaseFixture {
    return JSON.parse(readFileSync(new URL(`./fixtures/v${version}.json`, import.meta.url), 'utf8')) as DatabaseFixture;
  }

  it('a version-1 database gains an empty portfolios store, keeps its surveys, and takes a portfolio', async () => {
    const v1 = fixture(1);
    expect(v1.stores.portfolios).toBeUndefined();
    const name = uniqueName('v1-to-v2');
    await writeFixtureDatabase(name, v1);
    const { store, state } = await startLampwalk({ databaseName: name, environment: fakeEnvironment() });
    expect(state).toBe('returning');
    expect(await store.listPortfolios()).toEqual([]);
    const all = await store.listSurveys();
    // The fixture holds a GBP survey and the USD demo: a portfolio keeps to one currency.
    const surveys = all.filter((s) => s.money.currency === all[0]!.money.currency);
    expect(surveys.length).toBeGreaterThan(0);
    const portfolio = await store.createPortfolio(newPortfolio(surveys.map((s) => s.id)));
    const loaded = await Promise.all(portfolio.surveyIds.map((id) => store.loadSurvey(id)));
    const result = calculatePortfolio(portfolio, loaded);
    expect(result.sites).toHaveLength(surveys.length);
    expect(result.totals.fixtures).toBe(loaded.reduce((sum, s) => sum + calculateSurvey(s).totals.fixtures, 0));
    store.close();
    const after = await dumpDatabase(name);
    expect(after.stores.portfolios?.keyPath).toBe('id');
    expect(after.stores.portfolios?.records).toHaveLength(1);
  });

  it('the version-2 fixture’s portfolio and layout read back and calculate', async () => {
    const v2 = fixture(2);
    const name = uniqueName('v2');
    await writeFixtureDatabase(name, v2);
    const { store } = await startLampwalk({ databaseName: name, environment: fakeEnvironment() });
    const [portfolio] = await store.listPortfolios();
    expect(portfolio).toEqual(v2.stores.portfolios?.records[0]);
    const surveys = await Promise.all(portfolio!.surveyIds.map((id) => store.loadSurvey(id)));
    const withLayout = surveys.find((s) => s.layout);
    expect(withLayout?.layout?.unitCount).toBe(6);
    const result = calculatePortfolio(portfolio!, surveys);
    expect(result.units).toBe(6);
    expect(result.currency).toBe('GBP');
    store.close();
  });
});

describe('deleting a portfolio to the trash', () => {
  it('moves it to the trash in one transaction and brings it back, without the surveys deleted meanwhile', async () => {
    const clock = testClock('2027-02-01T08:00:00.000Z');
    const { store, second } = await twoSurveys(clock);
    const portfolio = await store.createPortfolio(newPortfolio(['demo-tallowmere', second]));
    const deleted = await countTransactions(() => store.deletePortfolio(portfolio.id));
    expect(deleted.readwrite).toBe(1);
    const trashId = deleted.result;
    expect((await failure(store.getPortfolio(portfolio.id))).kind).toBe('not-found');
    const [line] = await store.listTrash();
    expect(line).toMatchObject({ id: trashId, kind: 'portfolio', label: 'Canal estate (invented)', surveyId: '', parentId: null, rooms: 0, entries: 0, photos: 0 });
    // Its surveys stay where they are.
    expect((await store.listSurveys()).map((header) => header.id).sort()).toEqual(['demo-tallowmere', second].sort());

    // A survey deleted while the portfolio is in the trash is left out when it comes back.
    await store.deleteSurvey(second);
    const restored = await store.restoreFromTrash(trashId);
    expect(restored).toEqual({ kind: 'portfolio', surveyId: '', portfolioId: portfolio.id });
    expect(await store.getPortfolio(portfolio.id)).toEqual({ ...portfolio, surveyIds: ['demo-tallowmere'] });
    expect((await store.listTrash()).map((item) => item.kind)).toEqual(['survey']);
    expect((await failure(store.restoreFromTrash(trashId))).kind).toBe('not-found');
    store.close();
  });

  it('restoring it when a portfolio with its id was brought back meanwhile (from a backup) is a conflict, and nothing changes', async () => {
    const { store, second } = await twoSurveys();
    const portfolio = await store.createPortfolio(newPortfolio([second]));
    const backup = await store.exportEverything();
    const trashId = await store.deletePortfolio(portfolio.id);
    await store.importBackup(backup.text, 'replace');
    const fromBackup = await store.getPortfolio(portfolio.id);
    const conflict = await failure(store.restoreFromTrash(trashId));
    expect(conflict.kind).toBe('conflict');
    expect(conflict.message).toContain('“Canal estate (invented)” cannot be restored');
    expect(await store.getPortfolio(portfolio.id)).toEqual(fromBackup);
    expect((await store.listTrash()).map((item) => item.id)).toContain(trashId);
    store.close();
  });

  it('expires with the rest of the trash after 30 days', async () => {
    const clock = testClock('2027-03-01T08:00:00.000Z');
    const { store, second } = await twoSurveys(clock);
    const portfolio = await store.createPortfolio(newPortfolio([second]));
    await store.deletePortfolio(portfolio.id);
    clock.advanceDays(30.01);
    expect(await store.purgeTrash()).toBe(1);
    expect(await store.listTrash()).toEqual([]);
    store.close();
  });
});

describe('other windows hear of portfolio edits', () => {
  it('the store announces each committed portfolio edit (and none for a refused one), apart from survey changes', async () => {
    const { store, second } = await twoSurveys();
    const heard: PortfolioChange[] = [];
    const surveyChanges: StoreChange[] = [];
    const stop = store.onPortfolioChange((change) => heard.push(change));
    const stopSurveys = store.onChange((change) => surveyChanges.push(change));
    const a = await store.createPortfolio(newPortfolio(['demo-tallowmere', second]));
    const b = await store.createPortfolio(newPortfolio([second]));
    await store.updatePortfolio(a.id, { name: 'Renamed' });
    await store.updatePortfolio(a.id, { surveyIds: ['gone'] }).catch(() => undefined);
    const trashId = await store.deletePortfolio(a.id);
    await store.restoreFromTrash(trashId);
    // Deleting a survey changes both portfolios that list it.
    await store.deleteSurvey(second);
    stop();
    stopSurveys();
    await store.updatePortfolio(b.id, { name: 'Not heard' });
    const change = (portfolioId: string): PortfolioChange => ({ kind: 'portfolio', portfolioId });
    expect(heard.slice(0, 5)).toEqual([change(a.id), change(b.id), change(a.id), change(a.id), change(a.id)]);
    expect(heard.slice(5).map((item) => item.portfolioId).sort()).toEqual([a.id, b.id].sort());
    // Survey listeners hear only the survey deleted, never a portfolio edit.
    expect(surveyChanges).toEqual([{ surveyId: second, kind: 'layout', ids: [] }]);
    store.close();
  });

  it('a portfolio screen in another tab reads the portfolio again, and a changed survey of it, over BroadcastChannel', async () => {
    const databaseName = uniqueName('portfolio-tabs');
    const { store: a } = await startLampwalk({ databaseName, environment: fakeEnvironment() });
    const b = await openSurveyStore({ databaseName, environment: fakeEnvironment() });
    const id = demoPortfolio().id;
    const sessionB = await PortfolioSession.open(b, id);
    const sessionA = await PortfolioSession.open(a, id);
    try {
      expect(sessionB.snapshot.portfolio.name).toBe(demoPortfolio().name);
      // Tab A renames the portfolio and changes its budget; tab B shows both without being asked.
      expect(sessionA.update({ name: 'Fernhollow estate — year plan', plan: { budgetPerYear: 4000, years: 3 } })).toBeNull();
      await sessionA.flush();
      await vi.waitFor(() => {
        expect(sessionB.snapshot.portfolio.name).toBe('Fernhollow estate — year plan');
        expect(sessionB.snapshot.portfolio.plan.budgetPerYear).toBe(4000);
      }, { timeout: 10_000 });
      // Tab A takes a survey out; tab B's list and surveys follow.
      expect(sessionA.update({ surveyIds: demoPortfolio().surveyIds.slice(1) })).toBeNull();
      await sessionA.flush();
      await vi.waitFor(() => expect(sessionB.snapshot.portfolio.surveyIds).toEqual(demoPortfolio().surveyIds.slice(1)), { timeout: 10_000 });
      // An entry of one of its surveys changed in tab A (not through a portfolio): tab B reads that survey again.
      await a.updateEntry(demoFlatEntryIds.kitchen, { count: 4 });
      await vi.waitFor(() => {
        const entry = sessionB.snapshot.surveys.get('demo-wrenfold-flat')?.rooms.flatMap((room) => room.entries).find((item) => item.id === demoFlatEntryIds.kitchen);
        expect(entry?.count).toBe(4);
      }, { timeout: 10_000 });
      // Tab B's own edit made meanwhile is kept, together with tab A's.
      expect(sessionB.update({ notes: 'Asked for quotes' })).toBeNull();
      expect(sessionA.update({ client: { name: 'Fernhollow Housing Cooperative (invented)', contact: 'Estates team' } })).toBeNull();
      await Promise.all([sessionA.flush(), sessionB.flush()]);
      await vi.waitFor(() => {
        expect(sessionB.snapshot.portfolio.client.contact).toBe('Estates team');
        expect(sessionB.snapshot.portfolio.notes).toBe('Asked for quotes');
      }, { timeout: 10_000 });
      expect(await b.getPortfolio(id)).toMatchObject({ notes: 'Asked for quotes', client: { contact: 'Estates team' } });
      // Deleted in tab A: tab B keeps what it showed and says why it cannot read it.
      await a.deletePortfolio(id);
      await vi.waitFor(() => expect(sessionB.snapshot.status.error).toMatch(/no longer on this device/), { timeout: 10_000 });
    } finally {
      sessionA.dispose();
      sessionB.dispose();
      a.close();
      b.close();
    }
  });
});

describe('one currency per portfolio', () => {
  /** The demo survey and a copy of it costed in euros ("Block E"). */
  async function twoCurrencies(): Promise<{ store: SurveyStore; second: string; euro: string }> {
    const { store, second } = await twoSurveys();
    const { rooms: _rooms, id: _id, createdAt: _c, updatedAt: _u, ...fields } = demoSurvey();
    const euro = await store.createSurvey({ ...fields, name: 'Block E (invented)', money: { ...fields.money, currency: 'EUR' } });
    return { store, second, euro: euro.id };
  }

  it('creating or changing a portfolio to mix currencies is refused with the surveys and currencies named; nothing is written', async () => {
    const { store, second, euro } = await twoCurrencies();
    const created = await failure(store.createPortfolio(newPortfolio(['demo-tallowmere', second, euro])));
    expect(created.kind).toBe('invalid');
    expect(created.message).toContain(`“${demoSurvey().name}” and “Block B (invented)” use USD; “Block E (invented)” uses EUR`);
    expect(created.problems.map((problem) => problem.path)).toEqual(['surveyIds']);
    expect(await store.listPortfolios()).toEqual([]);

    const portfolio = await store.createPortfolio(newPortfolio(['demo-tallowmere', second]));
    const added = await failure(store.updatePortfolio(portfolio.id, { surveyIds: [second, euro] }));
    expect(added.kind).toBe('invalid');
    expect(added.message).toMatch(/“Block B \(invented\)” uses USD; “Block E \(invented\)” uses EUR/);
    expect(await store.getPortfolio(portfolio.id)).toEqual(portfolio);
    // One currency throughout is fine, in either currency.
    expect((await store.createPortfolio(newPortfolio([euro]))).surveyIds).toEqual([euro]);
    store.close();
  });

  it('changing a survey’s currency away from the rest of its portfolio is refused, naming the portfolio', async () => {
    const { store, second } = await twoCurrencies();
    await store.createPortfolio(newPortfolio(['demo-tallowmere', second]));
    const before = await store.getSurvey(second);
    const refused = await failure(store.updateSurvey(second, { money: { ...before.money, currency: 'EUR' } }));
    expect(refused.kind).toBe('invalid');
    expect(refused.message).toContain('“Block B (invented)” is in the portfolio “Canal estate (invented)”');
    expect(refused.message).toContain('cannot become EUR');
    expect(refused.problems.map((problem) => problem.path)).toEqual(['money.currency']);
    expect(await store.getSurvey(second)).toEqual(before);
    // Field by field (another window's way) is checked the same.
    expect((await failure(store.updateSurvey(second, { money: changeFields({ currency: 'EUR' }) }))).kind).toBe('invalid');
    // Other money fields still change, and a survey alone in its portfolio may change currency.
    expect((await store.updateSurvey(second, { money: changeFields({ energyRatePerKwh: 0.2 }) })).money.energyRatePerKwh).toBe(0.2);
    const alone = await store.createPortfolio(newPortfolio(['demo-tallowmere']));
    await store.updatePortfolio((await store.listPortfolios()).find((p) => p.id !== alone.id)!.id, { surveyIds: [second] });
    expect((await store.updateSurvey('demo-tallowmere', { money: changeFields({ currency: 'EUR' }) })).money.currency).toBe('EUR');
    store.close();
  });

  it('a portfolio already mixed (from a file) can still be renamed and cleaned up, but gains no new currency', async () => {
    const { store, second, euro } = await twoCurrencies();
    const { rooms: _rooms, id: _id, createdAt: _c, updatedAt: _u, ...fields } = demoSurvey();
    const pound = await store.createSurvey({ ...fields, name: 'Block P (invented)', money: { ...fields.money, currency: 'GBP' } });
    // Written as a backup would bring it: straight into the store, bypassing the check.
    const mixed = await store.createPortfolio(newPortfolio([second]));
    const backup = JSON.parse((await store.exportEverything()).text) as { portfolios: { id: string; surveyIds: string[] }[] };
    backup.portfolios.find((item) => item.id === mixed.id)!.surveyIds = [second, euro];
    await store.importBackup(JSON.stringify(backup), 'replace');
    expect((await store.getPortfolio(mixed.id)).surveyIds).toEqual([second, euro]);

    expect((await store.updatePortfolio(mixed.id, { name: 'Renamed' })).name).toBe('Renamed');
    expect((await failure(store.updatePortfolio(mixed.id, { surveyIds: [second, euro, pound.id] }))).message).toMatch(/uses GBP/);
    expect((await failure(store.updateSurvey(euro, { money: changeFields({ currency: 'GBP' }) }))).message).toMatch(/cannot become GBP/);
    // Bringing the euro survey into line with the other is allowed, and so is taking it out.
    expect((await store.updateSurvey(euro, { money: changeFields({ currency: 'USD' }) })).money.currency).toBe('USD');
    expect((await store.updatePortfolio(mixed.id, { surveyIds: [second] })).surveyIds).toEqual([second]);
    store.close();
  });
});
