/**
 * Cross-checks of repeated layouts and portfolios in survey files: a layout's
 * differing units name entries of their own survey, once each; a portfolio
 * names surveys of the same file, once each; ids are unique. These are
 * Lampwalk's own file-format rules (docs/file-format.md); common practice, no
 * published source.
 */
import { describe, expect, it } from 'vitest';
import { makeSurveyFile, type SurveyFile } from '../../src/survey/format.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import type { Portfolio, Survey } from '../../src/survey/model.ts';
import {
  layoutLinkProblems,
  parseSurvey,
  parseSurveyFile,
  portfolioLinkProblems,
  type FileProblem,
} from '../../src/survey/validate.ts';

function layoutSurvey(id = 'flat-a'): Survey {
  const survey = demoSurvey();
  survey.id = id;
  // Fresh room and entry ids so two of these can share a file.
  survey.rooms = survey.rooms.map((room) => ({
    ...room,
    id: `${id}-${room.id}`,
    entries: room.entries.map((entry) => ({ ...entry, id: `${id}-${entry.id}` })),
  }));
  const first = survey.rooms[0]!.entries[0]!.id;
  const second = survey.rooms[1]!.entries[0]!.id;
  survey.layout = {
    unitCount: 24,
    exceptions: [
      { id: 'u-3b', unitLabel: 'Flat 3B', entryCounts: [{ entryId: first, count: 0 }], notes: 'Converted last year' },
      { id: 'u-5a', unitLabel: 'Flat 5A', entryCounts: [{ entryId: first, count: 2 }, { entryId: second, count: 1 }], notes: '' },
    ],
  };
  return survey;
}

function portfolio(surveyIds: string[], id = 'pf-1'): Portfolio {
  return {
    id,
    name: 'North estate (invented)',
    client: { name: 'Example Lettings (invented)', contact: '' },
    surveyIds,
    plan: { budgetPerYear: 25_000, years: 3 },
    notes: '',
    createdAt: '2024-05-01T09:00:00.000Z',
    updatedAt: '2024-05-01T09:00:00.000Z',
  };
}

function file(surveys: Survey[], portfolios: Portfolio[]): SurveyFile {
  return makeSurveyFile(surveys, [], new Date(Date.UTC(2024, 4, 2, 8, 0, 0)), [], portfolios);
}

/** Round trip through JSON so the file is checked as read from disk. */
function parsed(value: SurveyFile): ReturnType<typeof parseSurveyFile> {
  return parseSurveyFile(JSON.parse(JSON.stringify(value)));
}

function problemsOf(result: { ok: true } | { ok: false; problems: FileProblem[] }): FileProblem[] {
  return result.ok ? [] : result.problems;
}

describe('a valid file with layouts and portfolios', () => {
  it('passes and keeps every layout and portfolio field', () => {
    const a = layoutSurvey('flat-a');
    const b = layoutSurvey('flat-b');
    const value = file([a, b], [portfolio(['flat-b', 'flat-a']), portfolio(['flat-a'], 'pf-2')]);
    const result = parsed(value);
    expect(problemsOf(result)).toEqual([]);
    if (result.ok) {
      expect(result.file.surveys[0]!.layout).toEqual(a.layout);
      expect(result.file.portfolios).toEqual(value.portfolios);
    }
  });

  it('a survey without a layout and an empty portfolio are fine', () => {
    const plain = demoSurvey();
    expect(problemsOf(parsed(file([plain], [portfolio([])])))).toEqual([]);
  });
});

describe('layout cross-checks', () => {
  it('refuses an exception entry id that is not an entry of that survey, at its path', () => {
    const a = layoutSurvey('flat-a');
    const b = layoutSurvey('flat-b');
    // An entry of the *other* survey in the file does not count.
    a.layout!.exceptions[1]!.entryCounts[1]!.entryId = b.rooms[0]!.entries[0]!.id;
    const problems = problemsOf(parsed(file([a, b], [])));
    expect(problems).toHaveLength(1);
    expect(problems[0]!.path).toBe('surveys[0].layout.exceptions[1].entryCounts[1].entryId');
    expect(problems[0]!.message).toContain('flat-b-demo-shop-troffers');
    expect(problems[0]!.message).toContain('names no fixture entry of this survey');
  });

  it('refuses the same entry counted twice in one unit, but allows it in two units', () => {
    const a = layoutSurvey();
    const first = a.rooms[0]!.entries[0]!.id;
    a.layout!.exceptions[1]!.entryCounts.push({ entryId: first, count: 5 });
    const problems = problemsOf(parsed(file([a], [])));
    expect(problems.map((p) => p.path)).toEqual(['surveys[0].layout.exceptions[1].entryCounts[2].entryId']);
    expect(problems[0]!.message).toMatch(/already counted in entryCounts\[0\]/);
  });

  it('refuses two differing units with one id', () => {
    const a = layoutSurvey();
    a.layout!.exceptions[1]!.id = 'u-3b';
    const problems = problemsOf(parsed(file([a], [])));
    expect(problems.map((p) => p.path)).toEqual(['surveys[0].layout.exceptions[1].id']);
    expect(problems[0]!.message).toMatch(/already used by layout\.exceptions\[0\]/);
  });

  it('refuses more differing units than units (schema rule) with the cross-check problems beside it', () => {
    const a = layoutSurvey();
    a.layout!.unitCount = 1;
    a.layout!.exceptions[0]!.entryCounts[0]!.entryId = 'nowhere';
    const paths = problemsOf(parsed(file([a], []))).map((p) => p.path);
    expect(paths).toContain('surveys[0].layout.exceptions');
    expect(paths).toContain('surveys[0].layout.exceptions[0].entryCounts[0].entryId');
  });

  it('parseSurvey runs the same checks with the caller’s path', () => {
    const a = layoutSurvey();
    a.layout!.exceptions[0]!.entryCounts[0]!.entryId = 'gone';
    const result = parseSurvey(JSON.parse(JSON.stringify(a)), 'surveys[4]');
    expect(problemsOf(result).map((p) => p.path)).toEqual(['surveys[4].layout.exceptions[0].entryCounts[0].entryId']);
    expect(parseSurvey(JSON.parse(JSON.stringify(layoutSurvey()))).ok).toBe(true);
  });

  it('layoutLinkProblems checks against a given set of entry ids (as the store does)', () => {
    const a = layoutSurvey();
    const only = new Set([a.rooms[0]!.entries[0]!.id]);
    const problems = layoutLinkProblems(a, '', only);
    expect(problems.map((p) => p.path)).toEqual(['layout.exceptions[1].entryCounts[1].entryId']);
  });
});

describe('portfolio cross-checks', () => {
  it('refuses a survey id not in the file at portfolios[i].surveyIds[j]', () => {
    const a = layoutSurvey('flat-a');
    const problems = problemsOf(parsed(file([a], [portfolio(['flat-a']), portfolio(['flat-a', 'flat-a', 'missing'], 'pf-2')])));
    expect(problems.map((p) => p.path)).toEqual(['portfolios[1].surveyIds[1]', 'portfolios[1].surveyIds[2]']);
    expect(problems[0]!.message).toMatch(/already listed at surveyIds\[0\]/);
    expect(problems[1]!.message).toMatch(/"missing" is not in this file/);
  });

  it('refuses two portfolios with one id', () => {
    const a = layoutSurvey('flat-a');
    const problems = problemsOf(parsed(file([a], [portfolio(['flat-a']), portfolio([], 'pf-1')])));
    expect(problems.map((p) => p.path)).toEqual(['portfolios[1].id']);
    expect(problems[0]!.message).toContain('portfolios[0]');
  });

  it('refuses a portfolio that breaks the schema, at the field', () => {
    const a = layoutSurvey('flat-a');
    const bad = { ...portfolio(['flat-a']), plan: { budgetPerYear: -1, years: 30 } };
    const paths = problemsOf(parsed(file([a], [bad]))).map((p) => p.path);
    expect(paths).toEqual(['portfolios[0].plan.budgetPerYear', 'portfolios[0].plan.years']);
  });

  it('portfolioLinkProblems works on unvalidated input without throwing', () => {
    expect(portfolioLinkProblems([null, 3, { surveyIds: 'x' }, { id: 'p', surveyIds: [7, 's1'] }], new Set(['s1']))).toEqual([]);
  });

  it('a version-2 file without portfolios reads as having none', () => {
    const a = layoutSurvey('flat-a');
    const { portfolios: _none, ...rest } = file([a], []);
    const v2 = { ...rest, version: 2 };
    delete (v2.surveys[0] as Partial<Survey>).layout;
    const result = parseSurveyFile(JSON.parse(JSON.stringify(v2)));
    expect(problemsOf(result)).toEqual([]);
    if (result.ok) expect(result.file.portfolios).toEqual([]);
  });
});
