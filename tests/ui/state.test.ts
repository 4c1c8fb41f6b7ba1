/**
 * The screens' own logic, without a browser: reading typed numbers,
 * formatting figures (never NaN), routes, preferences read back from
 * storage, the autosave queue, the survey session (checked edits, one store
 * call each, recalculation equal to a full calculation) and which catalog
 * products fit an entry. Expected values are the engine's own results or
 * invented test data (common practice, no published source).
 */
import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import { startLampwalk } from '../../src/survey/store.ts';
import { newEntryFields, existingFromTypical } from '../../src/ui/state/defaults.ts';
import { readNumber } from '../../src/ui/state/fields.ts';
import { judgeProducts, ratingProblems } from '../../src/ui/state/fit.ts';
import { inputText, uiFigures } from '../../src/ui/state/format.ts';
import { defaultPreferences, readPreferences } from '../../src/ui/state/preferences.ts';
import { SaveQueue } from '../../src/ui/state/queue.ts';
import { SurveySession } from '../../src/ui/state/session.ts';
import { totalsText } from '../../src/ui/state/totals.ts';
import { href, parseRoute, type Route } from '../../src/ui/router.ts';
import { typicalExistingEquipment } from '../../src/calc/equipment.ts';
import { fakeEnvironment, uniqueName } from '../store/helpers.ts';

describe('reading typed numbers', () => {
  it('takes a decimal point or a decimal comma', () => {
    expect(readNumber('1.5', { min: 0, max: 10 })).toEqual({ ok: true, value: 1.5 });
    expect(readNumber(' 1,5 ', { min: 0, max: 10 })).toEqual({ ok: true, value: 1.5 });
  });

  it('says what is wrong instead of giving NaN', () => {
    expect(readNumber('abc', { min: 0, max: 10 })).toMatchObject({ ok: false, message: expect.stringContaining('is not a number') });
    expect(readNumber('', { min: 0, max: 10 })).toEqual({ ok: false, message: 'Enter a number.' });
    expect(readNumber('', { min: 0, max: 10, optional: true })).toEqual({ ok: true, value: undefined });
    expect(readNumber('2.5', { min: 0, max: 10, integer: true })).toEqual({ ok: false, message: 'Enter a whole number.' });
    expect(readNumber('11', { min: 0, max: 10 })).toEqual({ ok: false, message: 'Must be between 0 and 10.' });
    expect(readNumber('0', { min: 0, max: 10, minExclusive: true })).toEqual({ ok: false, message: 'Must be more than 0 and at most 10.' });
  });

  it('refuses a number that may have been meant with a thousands separator', () => {
    expect(readNumber('1,500', { min: 0, max: 10_000 })).toMatchObject({ ok: false, message: expect.stringContaining('for 1500') });
    expect(readNumber('1,500', { min: 0, max: 10_000, integer: true })).toMatchObject({ ok: false, message: expect.stringContaining('for 1500') });
  });
});

describe('figures on screen', () => {
  const fig = uiFigures({ locale: 'en-US', units: 'imperial', money: { currency: 'USD' } });

  it('writes a dash, never NaN or Infinity', () => {
    expect(fig.kwhPerYear(Number.NaN)).toBe('— kWh/yr');
    expect(fig.money(Number.POSITIVE_INFINITY)).toBe('—');
    expect(fig.quantity('illuminance', Number.NaN)).toBe('— fc');
  });

  it('formats in the survey’s units, currency and locale', () => {
    // 538.19552 lx = 50 fc (1 fc = 10.7639 lx, exact from the international foot).
    expect(fig.quantity('illuminance', 538.19552)).toBe('50.0 fc');
    expect(fig.money(1234.5)).toBe('$1,235');
    expect(uiFigures({ locale: 'de-DE', units: 'si', money: { currency: 'EUR' } }).money(1234.5)).toBe('1.235\u00a0€');
    expect(fig.payback(null)).toBe('not repaid');
    expect(fig.irr({ kind: 'multiple', ratesPerYear: [0.05, 0.3], note: '' })).toBe('several (5.0 %, 30.0 %)');
    expect(fig.irr({ kind: 'none', reason: 'no sign change' })).toBe('none');
    expect(inputText(1.5, 'de-DE')).toBe('1,5');
    expect(inputText(undefined, 'en-US')).toBe('');
  });

  it('the overview figures of the demo come straight from the calculation', () => {
    const survey = demoSurvey();
    const result = calculateSurvey(survey);
    const text = totalsText(survey, result, uiFigures(survey));
    expect(text['total-kwh']).toBe(`${new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 }).format(result.totals.savings.kwhPerYear)} kWh/yr`);
    expect(Object.values(text).join(' ')).not.toMatch(/NaN|undefined/);
  });
});

describe('routes', () => {
  it('every screen has an address that reads back as the same screen', () => {
    const routes: Route[] = [
      { name: 'surveys' },
      { name: 'survey', surveyId: 'a b/c' },
      { name: 'room', surveyId: 's', roomId: 'r' },
      { name: 'entry', surveyId: 's', roomId: 'r', entryId: 'e' },
      { name: 'catalog' },
      { name: 'product', productId: 'p' },
      { name: 'settings' },
    ];
    for (const route of routes) expect(parseRoute(href(route))).toEqual(route);
    expect(parseRoute('#/s/x/q')).toEqual({ name: 'missing', hash: '#/s/x/q' });
    expect(parseRoute('#/s/%E0%A4%A')).toMatchObject({ name: 'missing' });
  });
});

describe('preferences read back from storage', () => {
  it('keeps good fields and falls back field by field', () => {
    const defaults = defaultPreferences('en-GB');
    expect(defaults.units).toBe('si');
    expect(defaults.currency).toBe('GBP');
    const read = readPreferences(
      JSON.stringify({ theme: 'sun', currency: 'XYZ', energyRatePerKwh: -1, circuitVolts: 230, logo: { dataUrl: 'javascript:alert(1)', width: 1, height: 1 }, extra: 1 }),
      defaults,
    );
    expect(read.theme).toBe('sun');
    expect(read.currency).toBe('GBP');
    expect(read.energyRatePerKwh).toBe(0);
    expect(read.logo).toBeNull();
    expect('extra' in read).toBe(false);
    expect(readPreferences('{not json', defaults)).toEqual(defaults);
    expect(defaultPreferences('en-US')).toMatchObject({ units: 'imperial', currency: 'USD', circuitVolts: 120 });
  });
});

describe('the autosave queue', () => {
  it('runs saves in order and merges patches of one record still waiting', async () => {
    const queue = new SaveQueue(String);
    const saved: unknown[] = [];
    let release = () => {};
    const gate = new Promise<void>((resolve) => (release = resolve));
    const first = queue.run(async () => {
      await gate;
      saved.push('first');
    });
    const a = queue.patch('entry:1', { count: 1 }, async (patch) => void saved.push(patch));
    const b = queue.patch('entry:1', { count: 12 }, async (patch) => void saved.push(patch));
    const c = queue.patch('entry:1', { notes: 'x' }, async (patch) => void saved.push(patch));
    expect(queue.status.pending).toBe(2);
    release();
    await Promise.all([first, a, b, c]);
    expect(saved).toEqual(['first', { count: 12, notes: 'x' }]);
    expect(queue.status).toEqual({ pending: 0, error: null });
  });

  it('reports a failure, and carries on with the next save', async () => {
    const queue = new SaveQueue((error) => (error instanceof Error ? error.message : 'failed'));
    await expect(queue.run(async () => Promise.reject(new Error('disk full')))).rejects.toThrow('disk full');
    expect(queue.status.error).toBe('disk full');
    await queue.run(async () => undefined);
    expect(queue.status.error).toBeNull();
  });
});

async function demoSession(): Promise<SurveySession> {
  const { store } = await startLampwalk({ databaseName: uniqueName('ui-session'), environment: fakeEnvironment() });
  return SurveySession.open(store, 'demo-tallowmere');
}

describe('the survey session', () => {
  it('an edit shows at once, equals a full calculation, and is saved by one store call', async () => {
    const session = await demoSession();
    expect(session.updateEntry('demo-shop-troffers', { count: 20 })).toBeNull();
    const shown = session.snapshot;
    expect(shown.survey.rooms[0]?.entries[0]?.count).toBe(20);
    expect(shown.result?.totals).toEqual(calculateSurvey(shown.survey).totals);
    expect(shown.lastEntryId).toBe('demo-shop-troffers');
    await session.flush();
    expect((await session.store.getEntry('demo-shop-troffers')).count).toBe(20);
  });

  it('a bad value comes back as a message naming the field; nothing is shown or saved', async () => {
    const session = await demoSession();
    const before = session.snapshot;
    expect(session.updateEntry('demo-shop-troffers', { count: -1 })).toMatch(/^count: /);
    expect(session.updateRoom('demo-shop', { workPlaneHeightMetres: 5 })).toMatch(/workPlaneHeightMetres/);
    expect(session.updateSurvey({ money: { ...before.survey.money, currency: 'NOPE' } })).toMatch(/currency/);
    expect(session.snapshot).toBe(before);
    await session.flush();
    expect((await session.store.getEntry('demo-shop-troffers')).count).toBe(12);
  });

  it('adds, repeats into another room, deletes and restores entries, keeping the results right', async () => {
    const session = await demoSession();
    const row = typicalExistingEquipment.find((item) => item.key === 'f32t8-2-elec');
    if (!row) throw new Error('no 2-lamp T8 row');
    const added = await session.addEntry('demo-stair', newEntryFields(existingFromTypical(row), 120));
    const copy = await session.repeatEntry(added.id, 'demo-basement');
    const snapshot = session.snapshot;
    expect(snapshot.lastEntryId).toBe(copy.id);
    expect(snapshot.result?.totals).toEqual(calculateSurvey(snapshot.survey).totals);
    expect((await session.store.listEntries('demo-basement')).at(-1)?.existing.description).toBe(row.label);
    const trashId = await session.deleteEntry(copy.id);
    expect(session.findEntry(copy.id)).toBeUndefined();
    await session.restore(trashId);
    expect(session.findEntry(copy.id)?.room.id).toBe('demo-basement');
  });

  it('adds the rows of a schedule in one call', async () => {
    const session = await demoSession();
    const row = typicalExistingEquipment[0]!;
    const stored = await session.addEntries('demo-shop', [newEntryFields(existingFromTypical(row), 120), newEntryFields(existingFromTypical(row), 120)]);
    expect(stored).toHaveLength(2);
    expect(session.findRoom('demo-shop')?.entries).toHaveLength(4);
    expect(session.snapshot.result?.totals.entries).toBe(calculateSurvey(session.snapshot.survey).totals.entries);
  });
});

describe('which products fit', () => {
  const survey = demoSurvey();
  const room = survey.rooms[0]!;
  const entry = { ...room.entries[0]!, conditions: { ...room.entries[0]!.conditions, dimmer: 'leading-edge' as const, enclosed: true } };

  it('names every rating that does not suit the fixture', () => {
    const basic = exampleCatalog.find((product) => product.id === 'example-a19-basic')!;
    expect(ratingProblems(basic, entry)).toEqual(['not dimmable, and this circuit has a dimmer', 'not rated for enclosed fixtures']);
    const wet = { ...entry, conditions: { ...entry.conditions, dimmer: 'none' as const, enclosed: false, location: 'wet' as const } };
    expect(ratingProblems(basic, wet)).toEqual(['rated for damp locations only; this one is wet']);
  });

  it('puts products that fit first, and judges light with the engine’s lumen ratio', () => {
    const judged = judgeProducts(survey, room, entry, exampleCatalog);
    expect(judged).toHaveLength(exampleCatalog.filter((product) => !product.retired).length);
    const firstMisfit = judged.findIndex((candidate) => candidate.reasons.length > 0);
    if (firstMisfit >= 0) expect(judged.slice(firstMisfit).every((candidate) => candidate.reasons.length > 0)).toBe(true);
    for (const candidate of judged) {
      if (candidate.result?.lumenVerdict === 'short') expect(candidate.reasons.some((reason) => reason.startsWith('too little light'))).toBe(true);
      if (!candidate.product.dimmable) expect(candidate.reasons).toContain('not dimmable, and this circuit has a dimmer');
    }
  });
});
