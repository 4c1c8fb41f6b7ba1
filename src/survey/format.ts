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
import type { CatalogProduct, Survey } from './model.ts';

/** Value of the `format` field in every Lampwalk survey file. */
export const fileFormatName = 'lampwalk-survey-file';

/**
 * The file-format version this build writes and reads natively. Older
 * versions are migrated on reading; newer ones are refused.
 * Raise it only together with a migration in `src/survey/validate.ts`.
 */
export const fileFormatVersion = 1;

/** A version-1 Lampwalk survey file as written to disk. */
export interface SurveyFile {
  format: typeof fileFormatName;
  version: typeof fileFormatVersion;
  /** When the file was written, ISO 8601 in UTC (e.g. "2024-05-01T09:30:00.000Z"). */
  exportedAt: string;
  surveys: Survey[];
  /** The user's own product catalog. */
  catalog: CatalogProduct[];
}

/**
 * Wraps surveys and the catalog in a survey file ready for `JSON.stringify`.
 * The arrays are used as given (not copied). Throws a {@link CalcInputError}
 * naming `exportedAt` when the date is invalid or outside the years 0–9999.
 *
 * @example
 * makeSurveyFile([], [], new Date(Date.UTC(2024, 4, 1, 9, 30)))
 * //=> { format: 'lampwalk-survey-file', version: 1, exportedAt: '2024-05-01T09:30:00.000Z', surveys: [], catalog: [] }
 */
export function makeSurveyFile(surveys: Survey[], catalog: CatalogProduct[], exportedAt: Date): SurveyFile {
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
  };
}
