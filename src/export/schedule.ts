/**
 * The fixture schedule as CSV: one row per fixture entry with every field of
 * the entry and its computed figures, and the way back in.
 *
 * Import runs in three steps:
 * 1. {@link previewSchedule} reads the CSV (papaparse), maps its columns to
 *    the schedule's fields (by header name, overridable with a mapping),
 *    builds a `FixtureEntry` per row and lists each bad row's problems with
 *    its spreadsheet row number (the header is row 1);
 * 2. the screen shows the preview;
 * 3. {@link commitRows} returns the new entries. It refuses the whole file
 *    when any row is bad, unless the caller asks to skip bad rows. It writes
 *    nothing itself: the caller stores the returned entries in the room in
 *    ONE store transaction, so a failed write leaves the room as it was.
 *
 * Columns named `room_*` and `calc_*` are written for reading and ignored
 * when importing.
 */
import * as v from 'valibot';
import { CalcInputError } from '../calc/errors.ts';
import type { SurveyResult } from '../calc/survey.ts';
import { parseDecimal } from '../calc/units.ts';
import { proposalFromCatalog } from '../survey/examples.ts';
import type {
  BallastKind,
  CatalogProduct,
  ControlChange,
  DimmerKind,
  Distribution,
  ExistingTechnology,
  FixtureEntry,
  MoistureRating,
  ProductForm,
  Survey,
  TubeType,
} from '../survey/model.ts';
import { fixtureEntrySchema } from '../survey/validate.ts';
import { pause, progressReporter } from './abort.ts';
import { csvFormat, readCsv, restoreCell, toCsv, utf8BytesOver, type CsvCell } from './csv.ts';
import { csvExporterFor } from './pdf.ts';
import type { CsvFormat, Exporter, ExportInput, ProgressCallback } from './types.ts';

// ---------------------------------------------------------------------------
// Closed sets (a Record over the union makes the compiler check each list is complete)

const keysOf = <T extends string>(record: Record<T, true>): readonly T[] => Object.keys(record) as T[];

const technologies = keysOf<ExistingTechnology>({
  incandescent: true,
  halogen: true,
  'cfl-screw': true,
  'cfl-pin': true,
  'linear-t12': true,
  'linear-t8': true,
  'linear-t5': true,
  'metal-halide': true,
  'high-pressure-sodium': true,
  'mercury-vapour': true,
  led: true,
  other: true,
});
const ballasts = keysOf<BallastKind>({ none: true, magnetic: true, electronic: true });
const dimmers = keysOf<DimmerKind>({ none: true, 'leading-edge': true, 'trailing-edge': true, '0-10v': true, unknown: true });
const moisture = keysOf<MoistureRating>({ dry: true, damp: true, wet: true });
const controls = keysOf<ControlChange>({ none: true, 'occupancy-sensor': true, 'vacancy-sensor': true, 'daylight-dimming': true, timer: true });
const forms = keysOf<ProductForm>({ 'screw-lamp': true, 'pin-lamp': true, 'linear-tube': true, luminaire: true, 'retrofit-kit': true });
const tubeTypes = keysOf<TubeType>({ 'not-a-tube': true, 'type-a': true, 'type-b': true, 'type-c': true, 'type-a-b': true });
const distributions = keysOf<Distribution>({ 'direct-narrow': true, 'direct-wide': true, 'semi-direct': true, diffuse: true, indirect: true });

// ---------------------------------------------------------------------------
// Columns

type Kind =
  | { type: 'text' }
  | { type: 'integer' }
  | { type: 'number' }
  | { type: 'boolean' }
  | { type: 'choice'; options: readonly string[] };

const text: Kind = { type: 'text' };
const integer: Kind = { type: 'integer' };
const number: Kind = { type: 'number' };
const boolean: Kind = { type: 'boolean' };
const choice = (options: readonly string[]): Kind => ({ type: 'choice', options });

type Value = string | number | boolean;

interface ColumnSpec {
  /** Dotted path in `FixtureEntry`, e.g. `existing.ratedWattsPerLamp`. */
  path: string;
  kind: Kind;
  aliases?: readonly string[];
}

/** The importable columns: CSV header → where it goes in a `FixtureEntry`. Names are stable. */
const inputColumns = {
  entry_id: { path: 'id', kind: text, aliases: ['id'] },
  count: { path: 'count', kind: integer, aliases: ['qty', 'quantity', 'fixtures', 'number of fixtures', 'fixture count'] },
  existing_technology: { path: 'existing.technology', kind: choice(technologies), aliases: ['technology', 'lamp type'] },
  existing_description: { path: 'existing.description', kind: text, aliases: ['description', 'existing', 'fixture'] },
  lamps_per_fixture: { path: 'existing.lampsPerFixture', kind: integer, aliases: ['lamps'] },
  rated_watts_per_lamp: { path: 'existing.ratedWattsPerLamp', kind: number, aliases: ['lamp watts', 'watts per lamp', 'watts'] },
  fixture_input_watts: { path: 'existing.fixtureInputWatts', kind: number, aliases: ['input watts'] },
  metered_watts_per_fixture: { path: 'existing.meteredWattsPerFixture', kind: number, aliases: ['metered watts'] },
  lumens_per_lamp: { path: 'existing.lumensPerLamp', kind: number, aliases: ['lamp lumens'] },
  ballast: { path: 'existing.ballast', kind: choice(ballasts) },
  ballast_factor: { path: 'existing.ballastFactor', kind: number },
  ballast_year: { path: 'existing.ballastYear', kind: integer },
  luminaire_efficiency: { path: 'existing.luminaireEfficiency', kind: number },
  existing_power_factor: { path: 'existing.powerFactor', kind: number },
  existing_cct_kelvin: { path: 'existing.cctKelvin', kind: number },
  existing_cri: { path: 'existing.cri', kind: number },
  lamp_life_hours: { path: 'existing.lampLifeHours', kind: number },
  lamp_price: { path: 'existing.lampPrice', kind: number },
  enclosed: { path: 'conditions.enclosed', kind: boolean },
  dimmer: { path: 'conditions.dimmer', kind: choice(dimmers) },
  location: { path: 'conditions.location', kind: choice(moisture) },
  emergency_circuit: { path: 'conditions.emergencyCircuit', kind: boolean, aliases: ['emergency'] },
  insulation_contact: { path: 'conditions.insulationContact', kind: boolean },
  circuit_volts: { path: 'conditions.circuitVolts', kind: number, aliases: ['volts', 'voltage'] },
  breaker_amps: { path: 'conditions.breakerAmps', kind: number, aliases: ['breaker'] },
  circuit_label: { path: 'conditions.circuitLabel', kind: text, aliases: ['circuit'] },
  control: { path: 'control', kind: choice(controls) },
  control_savings_fraction: { path: 'controlSavingsFraction', kind: number },
  notes: { path: 'notes', kind: text, aliases: ['note', 'comments'] },
  proposed_catalog_id: { path: 'proposed.catalogId', kind: text, aliases: ['catalog id'] },
  proposed_name: { path: 'proposed.name', kind: text, aliases: ['product', 'proposed product', 'proposed'] },
  proposed_form: { path: 'proposed.form', kind: choice(forms) },
  proposed_tube_type: { path: 'proposed.tubeType', kind: choice(tubeTypes) },
  proposed_units_per_fixture: { path: 'proposed.unitsPerFixture', kind: integer },
  proposed_watts_per_unit: { path: 'proposed.wattsPerUnit', kind: number },
  proposed_lumens_per_unit: { path: 'proposed.lumensPerUnit', kind: number },
  proposed_cct_kelvin: { path: 'proposed.cctKelvin', kind: number },
  proposed_cri: { path: 'proposed.cri', kind: number },
  proposed_power_factor: { path: 'proposed.powerFactor', kind: number },
  proposed_input_volts_min: { path: 'proposed.inputVoltsMin', kind: number, aliases: ['lowest input volts'] },
  proposed_input_volts_max: { path: 'proposed.inputVoltsMax', kind: number, aliases: ['highest input volts'] },
  proposed_dimmable: { path: 'proposed.dimmable', kind: boolean },
  proposed_enclosed_rated: { path: 'proposed.enclosedRated', kind: boolean },
  proposed_moisture_rating: { path: 'proposed.moistureRating', kind: choice(moisture) },
  proposed_ic_rated: { path: 'proposed.insulationContactRated', kind: boolean },
  proposed_emergency_listed: { path: 'proposed.emergencyListed', kind: boolean },
  proposed_rated_life_hours: { path: 'proposed.ratedLifeHours', kind: number },
  proposed_distribution: { path: 'proposed.distribution', kind: choice(distributions) },
  proposed_unit_cost: { path: 'proposed.unitCost', kind: number },
  proposed_install_minutes: { path: 'proposed.installMinutesPerFixture', kind: number },
  proposed_rebate_per_fixture: { path: 'proposed.rebatePerFixture', kind: number },
} as const satisfies Record<string, ColumnSpec>;

/** A field of the fixture schedule, named by its CSV column. */
export type ScheduleColumn = keyof typeof inputColumns;

/** The importable columns in file order. */
export const scheduleInputColumns = Object.keys(inputColumns) as ScheduleColumn[];

/** Read-only columns written before the entry's fields. */
export const scheduleRoomColumns = ['room_id', 'room_name', 'room_space_type'] as const;

/** Computed columns written after the entry's fields (ignored on import). */
export const scheduleComputedColumns = [
  'calc_watts_basis',
  'calc_existing_watts_per_fixture',
  'calc_proposed_watts_per_fixture',
  'calc_hours_per_year',
  'calc_existing_kwh_per_year',
  'calc_proposed_kwh_per_year',
  'calc_kwh_saved_per_year',
  'calc_peak_kw_saved',
  'calc_money_saved_per_year',
  'calc_net_cost',
  'calc_simple_payback_years',
  'calc_co2_kg_per_year',
  'calc_lumen_ratio',
  'calc_warnings',
] as const;

const columnByPath = new Map<string, ScheduleColumn>(scheduleInputColumns.map((c) => [inputColumns[c].path, c]));

function getPath(entry: FixtureEntry, path: string): unknown {
  let value: unknown = entry;
  for (const key of path.split('.')) {
    if (typeof value !== 'object' || value === null) return undefined;
    value = (value as Record<string, unknown>)[key];
  }
  return value;
}

// ---------------------------------------------------------------------------
// Export

/**
 * The fixture schedule as CSV: a header row, then one row per entry in
 * survey order with the room, every entry field and the computed figures.
 * Input fields are written at full precision (the import reads them back
 * exactly); computed ones are rounded for reading.
 *
 * @example fixtureScheduleCsv(demo, calculateSurvey(demo)).split('\r\n')[0].startsWith('room_id,room_name') //=> true
 */
export function fixtureScheduleCsv(survey: Survey, result: SurveyResult, format: CsvFormat = {}): string {
  const { decimalSeparator } = csvFormat(format);
  const rows: CsvCell[][] = [[...scheduleRoomColumns, ...scheduleInputColumns, ...scheduleComputedColumns]];
  survey.rooms.forEach((room, ri) => {
    const roomResult = result.rooms[ri];
    room.entries.forEach((entry, ei) => {
      const r = roomResult?.entries[ei];
      const row: CsvCell[] = [room.id, room.name, room.spaceType];
      for (const column of scheduleInputColumns) {
        const value = getPath(entry, inputColumns[column].path);
        row.push(typeof value === 'boolean' ? (value ? 'yes' : 'no') : typeof value === 'number' || typeof value === 'string' ? value : null);
      }
      if (r) {
        const payback = r.money.simplePaybackYears;
        row.push(
          r.wattsBasis,
          round(r.existing.wattsPerFixture, 2),
          round(r.proposed.wattsPerFixture, 2),
          round(r.existing.hoursPerYear, 1),
          round(r.existing.kwhPerYear, 1),
          round(r.proposed.kwhPerYear, 1),
          round(r.savings.kwhPerYear, 1),
          round(r.savings.peakKw, 3),
          round(r.money.totalPerYear, 2),
          round(r.money.cost.net, 2),
          payback === null ? null : round(payback, 2),
          round(r.co2KgPerYear, 1),
          r.lumenRatio === null ? null : round(r.lumenRatio, 3),
          r.warnings.map((w) => w.code).join(' '),
        );
      }
      rows.push(row);
    });
  });
  return toCsv(rows, { ...format, decimalSeparator });
}

function round(value: number, digits: number): number {
  const rounded = Number(value.toFixed(digits));
  return rounded === 0 ? 0 : rounded;
}

/** The fixture schedule exporter (CSV, UTF-8 with a byte-order mark for spreadsheets). */
export const fixtureScheduleExporter: Exporter<CsvFormat> = csvExporterFor(
  (input: ExportInput) => input.survey.name,
  'fixture-schedule-csv',
  'Fixture schedule (CSV)',
  'fixtures',
  (input, format) => fixtureScheduleCsv(input.survey, input.result, format),
);

// ---------------------------------------------------------------------------
// Import

/**
 * Which CSV column each schedule field is read from: a header of the file,
 * or `null` to leave the field out. Fields not named keep their automatic
 * match.
 */
export type ColumnMapping = Partial<Record<ScheduleColumn, string | null>>;

/** Settings for reading a fixture schedule. */
export interface ScheduleImportOptions extends CsvFormat {
  /** Overrides the automatic column matching. */
  mapping?: ColumnMapping;
  /** The user's catalog: a row naming a `proposed_catalog_id` from it needs no other proposed columns. */
  catalog?: readonly CatalogProduct[];
  /** `new` (default) gives every entry a fresh id; `keep` keeps the file's `entry_id` where there is one. */
  ids?: 'keep' | 'new';
  /** Makes a fresh entry id (default `crypto.randomUUID()`). */
  newId?: () => string;
  /** Circuit voltage for rows with no `circuit_volts` (without it, that column is required). */
  defaultCircuitVolts?: number;
}

/** One thing wrong with a row. */
export interface RowProblem {
  /** Spreadsheet row number: the header is row 1, the first data row is row 2. */
  rowNumber: number;
  /** The CSV column the problem is in, when it is in one. */
  column: string | null;
  message: string;
}

/** One data row of the preview. */
export interface PreviewRow {
  rowNumber: number;
  /** The `room_name` cell, when the file has one (for information). */
  roomName: string | null;
  /** The entry built from the row, or null when the row has problems. */
  entry: FixtureEntry | null;
  problems: RowProblem[];
}

/** What {@link previewSchedule} found: the column matching, every row, and the problems. */
export interface SchedulePreview {
  headers: string[];
  /** The CSV header each field is read from (absent: not imported). */
  mapping: Partial<Record<ScheduleColumn, string>>;
  /** Headers of the file that feed no field (the `room_*` and `calc_*` columns are not listed). */
  unmappedHeaders: string[];
  rows: PreviewRow[];
  /** Problems with the file as a whole (unreadable, a required column missing); any one rejects the file. */
  fileProblems: string[];
  /** Rows with at least one problem. */
  badRows: number;
}

/** Largest fixture schedule read, in bytes of UTF-8 (20 MB: about 30,000 rows of every column). */
export const scheduleMaxFileBytes = 20_000_000;

/** Why a schedule over {@link scheduleMaxFileBytes} is refused. */
export const scheduleTooLargeMessage = `the file is too large: a fixture schedule can be at most ${scheduleMaxFileBytes / 1_000_000} MB; split it into smaller files`;

/** Thrown by {@link commitRows} when the file is rejected; nothing has been written. */
export class ScheduleImportError extends Error {
  override readonly name = 'ScheduleImportError';
  constructor(
    readonly fileProblems: readonly string[],
    readonly rowProblems: readonly RowProblem[],
  ) {
    const lines = [...fileProblems, ...rowProblems.slice(0, 20).map((p) => `row ${p.rowNumber}${p.column ? `, ${p.column}` : ''}: ${p.message}`)];
    if (rowProblems.length > 20) lines.push(`and ${rowProblems.length - 20} more problems`);
    super(`the fixture schedule was not imported:\n${lines.join('\n')}`);
  }
}

/** Lower case letters and digits only, so "Rated watts / lamp" matches `rated_watts_per_lamp`-like names. */
function normaliseHeader(header: string): string {
  return header.toLowerCase().replace(/[^a-z0-9]/g, '');
}

/**
 * Matches CSV headers to schedule fields by name (case, spaces and
 * punctuation ignored; a few common aliases such as "Qty" and "Watts"),
 * first match wins.
 *
 * @example autoMapColumns(['Qty', 'Description', 'Lamp watts']).count //=> 'Qty'
 */
export function autoMapColumns(headers: readonly string[]): Partial<Record<ScheduleColumn, string>> {
  const mapping: Partial<Record<ScheduleColumn, string>> = {};
  const taken = new Set<string>();
  // Exact names first, then aliases, so an alias never steals a column named exactly.
  for (const pass of ['name', 'alias'] as const) {
    for (const column of scheduleInputColumns) {
      if (mapping[column] !== undefined) continue;
      const spec: ColumnSpec = inputColumns[column];
      const names = pass === 'name' ? [column] : (spec.aliases ?? []);
      const wanted = new Set(names.map(normaliseHeader));
      const found = headers.find((h) => !taken.has(h) && wanted.has(normaliseHeader(h)));
      if (found !== undefined) {
        mapping[column] = found;
        taken.add(found);
      }
    }
  }
  return mapping;
}

const trueWords = new Set(['yes', 'y', 'true', '1', 'x']);
const falseWords = new Set(['no', 'n', 'false', '0', '']);

function parseCell(raw: string, column: ScheduleColumn, decimalSeparator: '.' | ','): Value {
  const kind: Kind = inputColumns[column].kind;
  const cell = raw.trim();
  switch (kind.type) {
    case 'text':
      return raw;
    case 'boolean': {
      const word = cell.toLowerCase();
      if (trueWords.has(word)) return true;
      if (falseWords.has(word)) return false;
      throw new CalcInputError(column, `"${raw}" is not yes or no`);
    }
    case 'choice': {
      const wanted = cell.toLowerCase().replace(/[\s_]+/g, '-');
      const match = kind.options.find((o) => o === wanted);
      if (match === undefined) throw new CalcInputError(column, `"${raw}" is not one of ${kind.options.join(', ')}`);
      return match;
    }
    case 'integer':
    case 'number': {
      const other = decimalSeparator === '.' ? ',' : '.';
      if (cell.includes(other)) {
        throw new CalcInputError(
          column,
          `"${raw}" uses "${other}" but the decimal separator for this file is "${decimalSeparator}" (write numbers without thousands separators)`,
        );
      }
      const value = parseDecimal(cell, column, decimalSeparator);
      if (kind.type === 'integer' && !Number.isInteger(value)) throw new CalcInputError(column, `"${raw}" must be a whole number`);
      return value;
    }
  }
}

/** Fields a row must give (unless a default applies). */
const requiredColumns: readonly ScheduleColumn[] = ['count', 'existing_technology', 'rated_watts_per_lamp'];

/** Proposed-product fields a proposal needs when it does not come from the catalog. */
const proposedRequired: readonly ScheduleColumn[] = scheduleInputColumns.filter(
  (c) => c.startsWith('proposed_') && c !== 'proposed_catalog_id',
);

function setPath(target: Record<string, unknown>, path: string, value: Value): void {
  const keys = path.split('.');
  let node = target;
  for (const key of keys.slice(0, -1)) {
    let next = node[key];
    if (typeof next !== 'object' || next === null) {
      next = {};
      node[key] = next;
    }
    node = next as Record<string, unknown>;
  }
  node[keys[keys.length - 1]!] = value;
}

interface BuildContext {
  mapping: Partial<Record<ScheduleColumn, string>>;
  headerIndex: Map<string, number>;
  decimalSeparator: '.' | ',';
  catalog: ReadonlyMap<string, CatalogProduct>;
  options: ScheduleImportOptions;
  seenIds: Map<string, number>;
  newId: () => string;
}

function buildRow(cells: readonly string[], rowNumber: number, ctx: BuildContext): PreviewRow {
  const problems: RowProblem[] = [];
  const values = new Map<ScheduleColumn, Value>();
  for (const column of scheduleInputColumns) {
    const header = ctx.mapping[column];
    if (header === undefined) continue;
    const raw = restoreCell(cells[ctx.headerIndex.get(header) ?? -1] ?? '');
    // Empty cells leave the field at its default (text cells of only spaces are kept as they are).
    if (raw === '' || (raw.trim() === '' && inputColumns[column].kind.type !== 'text')) continue;
    try {
      values.set(column, parseCell(raw, column, ctx.decimalSeparator));
    } catch (err) {
      if (!(err instanceof CalcInputError)) throw err;
      problems.push({ rowNumber, column: header, message: err.problem });
    }
  }
  const roomHeader = ctx.headerIndex.get('room_name');
  const roomName = roomHeader === undefined ? null : restoreCell(cells[roomHeader] ?? '');

  const missing = (column: ScheduleColumn, why: string) =>
    problems.push({ rowNumber, column: ctx.mapping[column] ?? column, message: `is empty; ${why}` });
  for (const column of requiredColumns) {
    if (!values.has(column) && !problems.some((p) => p.column === (ctx.mapping[column] ?? column))) missing(column, 'every row needs it');
  }
  if (!values.has('circuit_volts') && ctx.options.defaultCircuitVolts !== undefined) values.set('circuit_volts', ctx.options.defaultCircuitVolts);
  if (!values.has('circuit_volts') && !problems.some((p) => p.column === (ctx.mapping.circuit_volts ?? 'circuit_volts'))) {
    missing('circuit_volts', 'give the circuit voltage (or choose a default voltage for the import)');
  }

  // The entry with its defaults, then the row's values on top.
  const draft: Record<string, unknown> = {
    id: '',
    count: 0,
    existing: { technology: 'other', description: '', lampsPerFixture: 1, ratedWattsPerLamp: 0, ballast: 'none' },
    conditions: { enclosed: false, dimmer: 'none', location: 'dry', emergencyCircuit: false, insulationContact: false, circuitVolts: 0 },
    proposed: null,
    control: 'none',
    notes: '',
  };
  const hasProposal = [...values.keys()].some((c) => c.startsWith('proposed_'));
  if (hasProposal) {
    const catalogId = values.get('proposed_catalog_id');
    const fromCatalog = typeof catalogId === 'string' ? ctx.catalog.get(catalogId.trim()) : undefined;
    draft.proposed = fromCatalog ? { ...proposalFromCatalog(fromCatalog) } : {};
    if (!fromCatalog) {
      for (const column of proposedRequired) {
        if (!values.has(column) && !problems.some((p) => p.column === (ctx.mapping[column] ?? column))) {
          missing(
            column,
            typeof catalogId === 'string'
              ? `"${catalogId}" is not in the catalog, so the proposal needs every proposed column`
              : 'a proposal needs every proposed column, or a proposed_catalog_id from the catalog',
          );
        }
      }
    }
  }
  for (const [column, value] of values) {
    const path = inputColumns[column].path;
    if (path.startsWith('proposed.') && !hasProposal) continue;
    if (column === 'proposed_catalog_id' && typeof value === 'string') {
      setPath(draft, path, value.trim());
      continue;
    }
    setPath(draft, path, value);
  }

  // Ids.
  const fileId = values.get('entry_id');
  if (ctx.options.ids === 'keep' && typeof fileId === 'string' && fileId.trim() !== '') {
    const id = fileId.trim();
    const first = ctx.seenIds.get(id);
    if (first !== undefined) problems.push({ rowNumber, column: ctx.mapping.entry_id ?? 'entry_id', message: `id "${id}" is already used on row ${first}` });
    else ctx.seenIds.set(id, rowNumber);
    draft.id = id;
  } else {
    draft.id = ctx.newId();
  }

  if (problems.length > 0) return { rowNumber, roomName, entry: null, problems };

  // The same validation as survey files: ranges, whole numbers, text lengths.
  const checked = v.safeParse(fixtureEntrySchema, draft);
  if (!checked.success) {
    for (const issue of checked.issues) {
      const path = (issue.path ?? []).map((p) => String(p.key)).join('.');
      const column = columnByPath.get(path) ?? null;
      problems.push({ rowNumber, column: column === null ? null : (ctx.mapping[column] ?? column), message: issue.message });
    }
    return { rowNumber, roomName, entry: null, problems };
  }
  return { rowNumber, roomName, entry: checked.output, problems };
}

/**
 * Reads a fixture schedule CSV and previews the import: matches columns
 * (automatically by header, `options.mapping` overriding), builds each row's
 * entry and lists every problem with its spreadsheet row number. Writes
 * nothing. Rejects with an `AbortError` when `signal` is aborted.
 *
 * @example (await previewSchedule(signal, 'count,existing_technology,rated_watts_per_lamp,circuit_volts\r\n4,halogen,50,230')).rows[0].entry.count //=> 4
 */
export async function previewSchedule(
  signal: AbortSignal,
  csvText: string,
  options: ScheduleImportOptions = {},
  onProgress?: ProgressCallback,
): Promise<SchedulePreview> {
  const progress = progressReporter(onProgress);
  progress(0);
  await pause(signal);
  const { decimalSeparator } = csvFormat(options);
  if (options.defaultCircuitVolts !== undefined && !(options.defaultCircuitVolts >= 12 && options.defaultCircuitVolts <= 1000)) {
    throw new CalcInputError('defaultCircuitVolts', `must be between 12 and 1000 (got ${options.defaultCircuitVolts})`);
  }
  if (utf8BytesOver(csvText, scheduleMaxFileBytes)) {
    // Refused before parsing: nothing of the text is read.
    progress(1);
    return { headers: [], mapping: {}, unmappedHeaders: [], rows: [], fileProblems: [scheduleTooLargeMessage], badRows: 0 };
  }
  const parsed = readCsv(csvText, options.delimiter);
  const fileProblems: string[] = [];
  const headerRow = (parsed.rows[0] ?? []).map((h) => restoreCell(h).trim());
  const headerIndex = new Map<string, number>();
  headerRow.forEach((h, i) => {
    if (h !== '' && !headerIndex.has(h)) headerIndex.set(h, i);
  });
  if (headerRow.every((h) => h === '')) fileProblems.push('the file is empty: the first row must name the columns');

  const mapping = autoMapColumns(headerRow.filter((h) => h !== ''));
  for (const [column, header] of Object.entries(options.mapping ?? {}) as [ScheduleColumn, string | null | undefined][]) {
    if (!Object.hasOwn(inputColumns, column)) {
      fileProblems.push(`the mapping names "${column}", which is not a fixture schedule column`);
      continue;
    }
    if (header === null) delete mapping[column];
    else if (header !== undefined) {
      if (headerIndex.has(header)) mapping[column] = header;
      else fileProblems.push(`the mapping reads ${column} from column "${header}", which is not in the file`);
    }
  }
  for (const column of requiredColumns) {
    if (mapping[column] === undefined) fileProblems.push(`no column for ${column}: name a column in the file for it`);
  }
  const used = new Set(Object.values(mapping));
  const unmappedHeaders = headerRow.filter((h) => h !== '' && !used.has(h) && !h.startsWith('room_') && !h.startsWith('calc_'));

  const rows: PreviewRow[] = [];
  const rowProblems = new Map<number, RowProblem[]>();
  for (const p of parsed.problems) rowProblems.set(p.rowNumber, [...(rowProblems.get(p.rowNumber) ?? []), { rowNumber: p.rowNumber, column: null, message: p.message }]);
  if (fileProblems.length === 0) {
    const catalog = new Map((options.catalog ?? []).map((p) => [p.id, p]));
    const ctx: BuildContext = {
      mapping,
      headerIndex,
      decimalSeparator,
      catalog,
      options,
      seenIds: new Map(),
      newId: options.newId ?? (() => globalThis.crypto.randomUUID()),
    };
    const total = parsed.rows.length;
    for (let i = 1; i < total; i++) {
      const cells = parsed.rows[i]!;
      const rowNumber = i + 1;
      if (cells.every((c) => c.trim() === '')) continue;
      const row = buildRow(cells, rowNumber, ctx);
      const extra = rowProblems.get(rowNumber);
      if (extra) {
        row.problems.unshift(...extra);
        row.entry = null;
      }
      if (cells.length > headerRow.length && cells.slice(headerRow.length).some((c) => c.trim() !== '')) {
        row.problems.push({ rowNumber, column: null, message: `has ${cells.length} cells but the header names ${headerRow.length} columns` });
        row.entry = null;
      }
      rows.push(row);
      if (i % 200 === 0) {
        progress(i / total);
        await pause(signal);
      }
    }
    if (rows.length === 0) fileProblems.push('the file has a header row but no fixture rows');
  }
  progress(1);
  return { headers: headerRow, mapping, unmappedHeaders, rows, fileProblems, badRows: rows.filter((r) => r.problems.length > 0).length };
}

/**
 * The entries to add to a room from a preview. Throws a
 * {@link ScheduleImportError} listing every problem when the file has a file
 * problem, or any bad row unless `skipBadRows` is set (then only good rows
 * are returned). Pure: the caller writes the returned entries in one store
 * transaction.
 *
 * @example commitRows(preview).length //=> preview.rows.length when no row is bad
 */
export function commitRows(preview: SchedulePreview, options: { skipBadRows?: boolean } = {}): FixtureEntry[] {
  const bad = preview.rows.flatMap((r) => r.problems);
  if (preview.fileProblems.length > 0 || (bad.length > 0 && options.skipBadRows !== true)) {
    throw new ScheduleImportError(preview.fileProblems, bad);
  }
  return preview.rows.flatMap((r) => (r.entry && r.problems.length === 0 ? [structuredClone(r.entry)] : []));
}
