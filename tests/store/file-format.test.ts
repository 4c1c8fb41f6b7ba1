/**
 * Survey file format version 2 (photos): a version-1 file is still read and
 * gains `photos: []`; each photo is checked field by field, its base64 text,
 * and that it belongs to a room or entry of a survey in the same file. The
 * rules are Lampwalk's own (docs/file-format.md; common practice, no
 * published source); base64 follows RFC 4648 section 4.
 */
import { describe, expect, it } from 'vitest';
import { demoSurvey } from '../../src/survey/demo.ts';
import { exampleCatalog } from '../../src/survey/examples.ts';
import { fileFormatVersion, makeSurveyFile, type SurveyFilePhoto } from '../../src/survey/format.ts';
import { base64ToBytes, bytesToBase64, photoFromFile, photoToFile } from '../../src/survey/photos.ts';
import { fixtureConditionsSchema, parseSurveyFile, problemsAgainst } from '../../src/survey/validate.ts';
import { bytesOf, patternBytes, tinyPngBase64 } from './helpers.ts';

function photo(fields: Partial<SurveyFilePhoto> = {}): SurveyFilePhoto {
  return {
    id: 'photo-1',
    ownerKind: 'room',
    ownerId: 'demo-shop',
    surveyId: 'demo-tallowmere',
    mimeType: 'image/png',
    widthPixels: 1,
    heightPixels: 1,
    createdAt: '2026-11-18T09:40:00.000Z',
    imageBase64: tinyPngBase64,
    thumbnailMimeType: 'image/png',
    thumbnailBase64: tinyPngBase64,
    ...fields,
  };
}

function fileWith(photos: SurveyFilePhoto[]): Record<string, unknown> {
  return JSON.parse(JSON.stringify(makeSurveyFile([demoSurvey()], [...exampleCatalog], new Date(Date.UTC(2026, 10, 18)), photos))) as Record<string, unknown>;
}

function problems(input: unknown): { path: string; message: string }[] {
  const result = parseSurveyFile(input);
  return result.ok ? [] : result.problems;
}

describe('file format version 2 (photos) and 3 (portfolios)', () => {
  it('is the version written, with photos and portfolios lists', () => {
    expect(fileFormatVersion).toBe(3);
    const file = makeSurveyFile([], [], new Date(Date.UTC(2026, 0, 1)));
    expect(file.version).toBe(3);
    expect(file.photos).toEqual([]);
    expect(file.portfolios).toEqual([]);
  });

  it('a version-1 file is read and migrated to the current version with no photos and no portfolios', () => {
    const { photos: _photos, portfolios: _portfolios, ...v1 } = fileWith([]);
    const result = parseSurveyFile({ ...v1, version: 1 });
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    expect(result.file.version).toBe(3);
    expect(result.file.photos).toEqual([]);
    expect(result.file.portfolios).toEqual([]);
    expect(result.file.surveys[0]).toEqual(demoSurvey());
  });

  it('a version-2 file without photos is missing a field', () => {
    const { photos: _photos, ...file } = fileWith([]);
    expect(problems(file)).toEqual([{ path: 'photos', message: 'is missing: required in a Lampwalk survey file' }]);
  });

  it('accepts photos of a room and of an entry', () => {
    const result = parseSurveyFile(fileWith([photo(), photo({ id: 'photo-2', ownerKind: 'entry', ownerId: 'demo-shop-display', mimeType: 'image/jpeg' })]));
    expect(result.ok).toBe(true);
  });

  it('reports each bad photo field at its path', () => {
    const found = problems(
      fileWith([
        photo({ widthPixels: 0, mimeType: 'image/gif' as SurveyFilePhoto['mimeType'] }),
        photo({ id: 'photo-2', imageBase64: 'abc', thumbnailBase64: '' }),
        photo({ id: 'photo-3', ownerKind: 'wall' as SurveyFilePhoto['ownerKind'] }),
      ]),
    );
    expect(found).toContainEqual({ path: 'photos[0].widthPixels', message: 'must be a whole number between 1 and 100000 (got 0)' });
    expect(found).toContainEqual({ path: 'photos[0].mimeType', message: 'must be one of "image/jpeg", "image/png", "image/webp" (got text "image/gif")' });
    expect(found.find((problem) => problem.path === 'photos[1].imageBase64')?.message).toMatch(/^must be non-empty base64 text .*\(got text "abc"\)$/);
    expect(found.find((problem) => problem.path === 'photos[1].thumbnailBase64')?.message).toMatch(/\(got text ""\)$/);
    expect(found.find((problem) => problem.path === 'photos[2].ownerKind')?.message).toBe('must be one of "room", "entry" (got text "wall")');
  });

  it('refuses a photo whose survey, room or entry is not in the file, and duplicate photo ids', () => {
    const found = problems(
      fileWith([
        photo({ surveyId: 'elsewhere' }),
        photo({ id: 'photo-2', ownerId: 'demo-shop-display' }),
        photo({ id: 'photo-3', ownerKind: 'entry', ownerId: 'demo-shop' }),
        photo({ id: 'photo-3' }),
      ]),
    );
    expect(found).toEqual([
      { path: 'photos[3].id', message: 'id "photo-3" is already used by photos[2]; every photo needs an id of its own' },
      { path: 'photos[0].surveyId', message: 'survey "elsewhere" is not in this file; a photo must belong to a survey in the same file' },
      {
        path: 'photos[1].ownerId',
        message: 'survey "demo-tallowmere" has no room "demo-shop-display"; a photo must show a room or entry of its survey',
      },
      {
        path: 'photos[2].ownerId',
        message: 'survey "demo-tallowmere" has no fixture entry "demo-shop"; a photo must show a room or entry of its survey',
      },
    ]);
  });

  it('refuses an unknown photo field', () => {
    const file = fileWith([photo()]);
    (file.photos as Record<string, unknown>[])[0]!.caption = 'Ceiling';
    expect(problems(file)[0]?.path).toBe('photos[0].caption');
  });
});

describe('photo bytes', () => {
  it('base64 round-trips every byte value (RFC 4648 section 4 test vectors too)', () => {
    // Longer than one 32 KB chunk of the encoder, so chunk boundaries are crossed.
    const bytes = patternBytes(70_000, 7);
    const back = base64ToBytes(bytesToBase64(bytes));
    expect(back.length).toBe(bytes.length);
    expect(Buffer.from(back).equals(Buffer.from(bytes))).toBe(true);
    expect(new Set(bytes).size).toBe(256);
    // RFC 4648 section 10 test vectors.
    expect(bytesToBase64(new TextEncoder().encode('foob'))).toBe('Zm9vYg==');
    expect(bytesToBase64(new TextEncoder().encode('foobar'))).toBe('Zm9vYmFy');
    expect(Buffer.from(base64ToBytes(tinyPngBase64)).subarray(1, 4).toString('latin1')).toBe('PNG');
  });

  it('a photo goes to the file and back with the same bytes and types', async () => {
    const filePhoto = photo({ imageBase64: bytesToBase64(patternBytes(5000, 3)), thumbnailMimeType: 'image/webp' });
    const stored = photoFromFile(filePhoto);
    expect(stored.image.type).toBe('image/png');
    expect(stored.thumbnail.type).toBe('image/webp');
    expect(await bytesOf(stored.image)).toEqual(patternBytes(5000, 3));
    expect(await photoToFile(stored)).toEqual(filePhoto);
  });
});

describe('problemsAgainst', () => {
  it('checks one value against one schema, prefixing the path', () => {
    const conditions = demoSurvey().rooms[0]!.entries[0]!.conditions;
    expect(problemsAgainst(fixtureConditionsSchema, conditions)).toEqual([]);
    expect(problemsAgainst(fixtureConditionsSchema, { ...conditions, circuitVolts: 5 }, 'conditions')).toEqual([
      { path: 'conditions.circuitVolts', message: 'must be a number between 12 and 1000 (got 5)' },
    ]);
  });
});
