import { describe, expect, it } from 'vitest';
import { chooseProducts } from '../../src/calc/choice.ts';
import { main } from '../../src/cli/main.ts';
import { demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import { parseSurveyFileText } from '../../src/survey/validate.ts';
import { demoFileText, fakeIo } from './support.ts';

describe('lampwalk choose', () => {
  it('prints the best product per entry with its LCC and every rejected product with a one-line reason', async () => {
    const text = await demoFileText();
    const io = fakeIo({ 'demo.json': text });
    expect(await main(['choose', 'demo.json'], io)).toBe(0);
    const out = JSON.parse(io.out);
    expect(out.format).toBe('lampwalk-product-choice');
    const direct = chooseProducts(demoSurvey(), exampleCatalog);
    expect(out.counts).toEqual(direct.counts);
    expect(out.entries).toHaveLength(direct.entries.length);
    for (const [i, printed] of out.entries.entries()) {
      const e = direct.entries[i]!;
      expect(printed.entryId).toBe(e.entryId);
      expect(printed.best?.productId ?? null).toBe(e.best?.productId ?? null);
      if (e.best) expect(printed.best.lifeCycleCost).toBeCloseTo(e.best.lifeCycleCost!, 6);
      const rejected = e.candidates.filter((c) => !c.accepted);
      expect(printed.rejected).toHaveLength(rejected.length);
      for (const r of printed.rejected) {
        expect(r.reasons.length).toBeGreaterThan(0);
        for (const line of r.reasons) expect(line).not.toContain('\n');
      }
    }
    // The demo's dimmed pendants: the non-dimmable lamp is turned down for the dimmer.
    const pendants = out.entries.find((e: { entryId: string }) => e.entryId === 'demo-flat1-pendants');
    const basic = pendants.rejected.find((r: { productId: string }) => r.productId === 'example-a19-basic');
    expect(basic.reasons).toContain('not-dimmable: not dimmable, and this circuit has a dimmer');
    expect(io.written.size).toBe(0);
  });

  it('--apply --out writes a new valid survey file with the best products, leaving the input alone', async () => {
    const text = await demoFileText();
    const io = fakeIo({ 'demo.json': text });
    expect(await main(['choose', 'demo.json', '--apply', '--out', 'new.json'], io)).toBe(0);
    expect([...io.written.keys()]).toEqual(['new.json']);
    const parsed = parseSurveyFileText(io.writtenText('new.json')!);
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const direct = chooseProducts(demoSurvey(), exampleCatalog);
    const after = parsed.file.surveys[0]!;
    const before = demoSurvey();
    for (const [ri, room] of after.rooms.entries()) {
      for (const [ei, entry] of room.entries.entries()) {
        const c = direct.entries.find((e) => e.entryId === entry.id)!;
        const expected = c.changed ? c.best!.productId : before.rooms[ri]!.entries[ei]!.proposed?.catalogId;
        expect(entry.proposed?.catalogId).toBe(expected);
      }
    }
    expect(io.err).toMatch(/wrote new\.json with \d+ entries changed/);
  });

  it('--entry applies only the named entries', async () => {
    const io = fakeIo({ 'demo.json': await demoFileText() });
    expect(await main(['choose', 'demo.json', '--apply', '--out', 'one.json', '--entry', 'demo-flat1-pendants'], io)).toBe(0);
    const parsed = parseSurveyFileText(io.writtenText('one.json')!);
    if (!parsed.ok) throw new Error('not a valid file');
    const before = demoSurvey();
    const direct = chooseProducts(before, exampleCatalog).entries.find((e) => e.entryId === 'demo-flat1-pendants')!;
    expect(direct.changed).toBe(true);
    for (const [ri, room] of parsed.file.surveys[0]!.rooms.entries()) {
      for (const [ei, entry] of room.entries.entries()) {
        const old = before.rooms[ri]!.entries[ei]!;
        if (entry.id === 'demo-flat1-pendants') expect(entry).toEqual({ ...old, proposed: direct.best!.proposal });
        else expect(entry).toEqual(old);
      }
    }
  });

  it('refuses bad usage with a clear message and exit code 2', async () => {
    const files = { 'demo.json': await demoFileText() };
    const cases: [string[], RegExp][] = [
      [['choose'], /needs a survey file/],
      [['choose', 'demo.json', '--apply'], /--out/],
      [['choose', 'demo.json', '--apply', '--out', 'demo.json'], /input file is never changed/],
      [['choose', 'demo.json', '--bogus'], /unknown option --bogus/],
      [['choose', 'demo.json', '--apply', '--out', 'x.json', '--entry', 'nope'], /no entry with id "nope"/],
      [['choose', 'missing.json'], /no such file/],
    ];
    for (const [args, message] of cases) {
      const io = fakeIo(files);
      expect(await main(args, io)).toBe(2);
      expect(io.err).toMatch(message);
    }
  });

  it('is listed in the help text', async () => {
    const io = fakeIo();
    expect(await main(['help'], io)).toBe(0);
    expect(io.out).toContain('choose <file>');
    expect(io.out).toContain('--apply --out <file>');
  });
});
