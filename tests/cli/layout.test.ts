/**
 * `lampwalk calc` on a survey with a repeated layout prints a `layout` object
 * beside `totals` with the figures for all units; a survey without a layout
 * prints exactly what it did before. Invented demo data (common practice, no
 * published source).
 */
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import { calculateLayout } from '../../src/calc/portfolio.ts';
import { calculateSurvey } from '../../src/calc/survey.ts';
import { makeSurveyFile } from '../../src/survey/format.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import type { Survey } from '../../src/survey/model.ts';
import { fakeIo } from './support.ts';

function fileWith(survey: Survey): string {
  return JSON.stringify(makeSurveyFile([survey], [], new Date(Date.UTC(2026, 2, 1))));
}

describe('lampwalk calc with a repeated layout', () => {
  it('adds a layout object with the all-units totals, economics and fixtures by entry', async () => {
    const survey: Survey = {
      ...demoSurvey(),
      layout: { unitCount: 24, exceptions: [{ id: 'f3b', unitLabel: 'Flat 3B', entryCounts: [{ entryId: 'demo-shop-troffers', count: 0 }], notes: '' }] },
    };
    const io = fakeIo({ 'flats.json': fileWith(survey) });
    expect(await main(['calc', 'flats.json'], io)).toBe(0);
    const printed = JSON.parse(io.out).surveys[0];
    const direct = calculateLayout(survey);
    expect(printed.totals).toEqual(JSON.parse(JSON.stringify(calculateSurvey(survey).totals)));
    expect(printed.layout.units).toBe(24);
    expect(printed.layout.differingUnits).toBe(1);
    expect(printed.layout.totals).toEqual(JSON.parse(JSON.stringify(direct.totals)));
    expect(printed.layout.economics.netPresentValue).toBe(direct.economics.netPresentValue);
    // 12 troffers per flat, 23 flats still to do.
    expect(printed.layout.fixturesByEntry['demo-shop-troffers']).toBe(23 * 12);
  });

  it('exits 2 naming the field when a differing unit names no entry', async () => {
    const text = fileWith(demoSurvey()).replace('"rooms":', '"layout":{"unitCount":2,"exceptions":[{"id":"x","unitLabel":"X","entryCounts":[{"entryId":"nope","count":1}],"notes":""}]},"rooms":');
    const io = fakeIo({ 'bad.json': text });
    expect(await main(['calc', 'bad.json'], io)).toBe(2);
    expect(io.err).toContain('surveys[0].layout.exceptions[0].entryCounts[0].entryId');
  });

  it('prints no layout object for a survey without one', async () => {
    const io = fakeIo({ 'demo.json': fileWith(demoSurvey()) });
    expect(await main(['calc', 'demo.json'], io)).toBe(0);
    expect(Object.hasOwn(JSON.parse(io.out).surveys[0], 'layout')).toBe(false);
  });
});
