/**
 * The Lampwalk survey file: one JSON document that is both the app's backup
 * export and the command line's input. It wraps the domain model
 * (`src/survey/model.ts`) with a format name and a version number so that a
 * reader can tell a survey file from any other JSON, refuse files written by
 * a newer Lampwalk, and migrate files written by an older one.
 *
 * The format is documented for users and integrators in `docs/file-format.md`
 * and validated by `src/survey/validate.ts`.
 */
import { CalcInputError } from '../calc/errors.ts';
import type { CatalogProduct, PhotoMimeType, PhotoOwnerKind, Portfolio, Survey } from './model.ts';

/** Value of the `format` field in every Lampwalk survey file. */
export const fileFormatName = 'lampwalk-survey-file';

/**
 * The file-format version this build writes and reads natively. Older
 * versions are migrated on reading; newer ones are refused.
 * Raise it only together with a migration in `src/survey/validate.ts`.
 */
export const fileFormatVersion = 3;

/**
 * A photo in a survey file: the image and its thumbnail as base64 text
 * (RFC 4648 standard alphabet, with padding). Version 2 and later.
 */
export interface SurveyFilePhoto {
  id: string;
  ownerKind: PhotoOwnerKind;
  /** Id of the room or fixture entry the photo shows; it must be in the survey named by `surveyId`. */
  ownerId: string;
  surveyId: string;
  mimeType: PhotoMimeType;
  widthPixels: number;
  heightPixels: number;
  /** ISO 8601 timestamp. */
  createdAt: string;
  imageBase64: string;
  thumbnailMimeType: PhotoMimeType;
  thumbnailBase64: string;
}

/** A Lampwalk survey file (version 3) as written to disk. */
export interface SurveyFile {
  format: typeof fileFormatName;
  version: typeof fileFormatVersion;
  /** When the file was written, ISO 8601 in UTC (e.g. "2024-05-01T09:30:00.000Z"). */
  exportedAt: string;
  surveys: Survey[];
  /** The user's own product catalog. */
  catalog: CatalogProduct[];
  /** Photos of the surveys' rooms and entries (added in version 2; a version-1 file is read as having none). */
  photos: SurveyFilePhoto[];
  /** Portfolios grouping the surveys (added in version 3; an older file is read as having none). */
  portfolios: Portfolio[];
}

/**
 * Wraps surveys, the catalog and photos in a survey file ready for
 * `JSON.stringify`. The arrays are used as given (not copied). Throws a
 * {@link CalcInputError} naming `exportedAt` when the date is invalid or
 * outside the years 0–9999.
 *
 * @example
 * makeSurveyFile([], [], new Date(Date.UTC(2024, 4, 1, 9, 30)))
 * //=> { format: 'lampwalk-survey-file', version: 3, exportedAt: '2024-05-01T09:30:00.000Z', surveys: [], catalog: [], photos: [], portfolios: [] }
 */
export function makeSurveyFile(
  surveys: Survey[],
  catalog: CatalogProduct[],
  exportedAt: Date,
  photos: SurveyFilePhoto[] = [],
  portfolios: Portfolio[] = [],
): SurveyFile {
  if (!(exportedAt instanceof Date) || Number.isNaN(exportedAt.getTime())) {
    throw new CalcInputError('exportedAt', 'must be a valid date');
  }
  const year = exportedAt.getUTCFullYear();
  if (year < 0 || year > 9999) {
    // toISOString() writes such years as "+010000-…", which is not a plain ISO 8601 timestamp.
    throw new CalcInputError('exportedAt', `must be in the years 0 to 9999 (got ${year})`);
  }
  return {
    format: fileFormatName,
    version: fileFormatVersion,
    exportedAt: exportedAt.toISOString(),
    surveys,
    catalog,
    photos,
    portfolios,
  };
}
