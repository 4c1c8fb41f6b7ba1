/**
 * The client report: the document a building owner decides on. Cover,
 * summary with charts, room-by-room tables, light adequacy, warnings and the
 * actions they need, photos, assumptions with their published sources, and
 * the cautions. Every figure comes from `SurveyResult` and is written with
 * the survey's {@link Figures}.
 */
import { calculateLayout, type LayoutResult } from '../calc/portfolio.ts';
import type { EntryResult, RoomResult, SurveyResult } from '../calc/survey.ts';
import { safetyDeferral, type Severity, type Warning } from '../calc/warnings.ts';
import type { ControlChange, Survey } from '../survey/model.ts';
import { pause, progressReporter } from './abort.ts';
import { drawCashFlowChart, drawKwhByRoomChart } from './charts.ts';
import { figuresFor, lightQualitySentence, lightVerdict, type Figures, type LightVerdict } from './figures.ts';
import { layoutNote } from './orders.ts';
import { checkImage, colours, paperFor, pdfExporter, PdfWriter, sizes } from './pdf.ts';
import type { Exporter, ExportInput, ProgressCallback, ReportSettings } from './types.ts';
import type { CellDef, RowInput } from 'jspdf-autotable';

/** Document title on the cover and in the running header. */
export const reportTitle = 'Lighting upgrade assessment';

/** Headings of the report's sections, in order (tests look for them). */
export const reportSections = {
  summary: 'Summary',
  rooms: 'Room by room',
  adequacy: 'Light levels and power density',
  warnings: 'Warnings and required actions',
  photos: 'Site photos',
  assumptions: 'Assumptions and sources',
  disclaimer: 'Cautions and disclaimer',
} as const;

/** Section heading of each severity, most serious first. */
export const severityHeadings: Readonly<Record<Severity, string>> = {
  danger: 'Danger: fix before anything is ordered or installed',
  caution: 'Caution: change the product or the plan',
  advice: 'Advice: check or record; does not stop the job',
};

const severityColours: Readonly<Record<Severity, [number, number, number]>> = {
  danger: colours.danger,
  caution: colours.caution,
  advice: colours.advice,
};

const controlWords: Readonly<Record<ControlChange, string>> = {
  none: '',
  'occupancy-sensor': 'occupancy sensor',
  'vacancy-sensor': 'vacancy sensor',
  'daylight-dimming': 'daylight dimming',
  timer: 'time switch',
};

/** Column headings of the per-room fixture tables (shared with the benchmark's bare table). */
export const entryTableHead = ['Qty', 'Now', 'Proposed', 'W/fixture now', 'W/fixture new', 'kWh/yr saved', 'Saved/yr', 'Net cost', 'Payback'];

/**
 * The rows of one room's fixture table, as printed.
 *
 * @example roomEntryRows(demo, result, 0, figuresFor(demo))[0][0] //=> '12'
 */
export function roomEntryRows(survey: Survey, result: SurveyResult, roomIndex: number, fig: Figures): string[][] {
  const room = result.rooms[roomIndex]!;
  const surveyRoom = survey.rooms[roomIndex];
  return room.entries.map((e, i) => {
    const entry = surveyRoom?.entries[i];
    const control = entry ? controlWords[entry.control] : '';
    const basis = e.wattsBasis === 'metered' ? ' (metered)' : e.wattsBasis === 'estimated' ? ' (estimated watts)' : '';
    const proposed = e.proposedName === null ? (control ? 'Keep fixtures' : 'No change') : e.proposedName;
    return [
      fig.number(e.count, 0),
      `${e.description}${basis}`,
      control ? `${proposed} + ${control}` : proposed,
      fig.watts(e.existing.wattsPerFixture),
      fig.watts(e.proposed.wattsPerFixture),
      fig.number(e.savings.kwhPerYear, 0),
      fig.money(e.money.totalPerYear),
      fig.money(e.money.cost.net),
      fig.paybackShort(e.money.simplePaybackYears),
    ];
  });
}

const entryColumnStyles = {
  0: { halign: 'right' as const, cellWidth: 26 },
  3: { halign: 'right' as const, cellWidth: 44 },
  4: { halign: 'right' as const, cellWidth: 44 },
  5: { halign: 'right' as const, cellWidth: 54 },
  6: { halign: 'right' as const, cellWidth: 50 },
  7: { halign: 'right' as const, cellWidth: 52 },
  8: { halign: 'right' as const, cellWidth: 48 },
};

/**
 * The per-room fixture table's column styles (shared with the benchmark).
 *
 * @example entryTableColumnStyles()[0] //=> { halign: 'right', cellWidth: 26 }
 */
export function entryTableColumnStyles(): typeof entryColumnStyles {
  return entryColumnStyles;
}

/** All-units figures of a survey with a repeated layout, or null without one. */
function layoutOf(survey: Survey, result: SurveyResult): LayoutResult | null {
  return survey.layout ? calculateLayout(survey, result) : null;
}

function cover(w: PdfWriter, survey: Survey, result: SurveyResult, settings: ReportSettings, fig: Figures): void {
  w.companyBlock(settings, w.margin.left, 40);
  let y = 190;
  w.doc.setFillColor(...colours.accent);
  w.doc.rect(w.margin.left, y - 30, 40, 4, 'F');
  w.font(sizes.title + 2, 'bold', colours.accent);
  w.textAt(reportTitle, w.margin.left, y);
  y += 24;
  w.font(sizes.heading, 'normal', colours.ink);
  for (const line of w.wrap(survey.name, w.width)) {
    w.doc.text(line, w.margin.left, y);
    y += 18;
  }
  w.y = y + 14;
  const preparedBy = settings.preparedBy ?? survey.preparedBy;
  const rows: [string, string][] = [
    ['Client', survey.client.name],
    ['Contact', survey.client.contact],
    ['Site', survey.site.name],
    ['Address', survey.site.address],
    ['Date', fig.date(settings.date)],
    ['Prepared by', preparedBy],
  ];
  w.table({
    theme: 'plain',
    body: rows.filter(([, value]) => value.trim() !== ''),
    styles: { fontSize: sizes.body + 1, cellPadding: { top: 3, bottom: 3, left: 0, right: 6 }, lineWidth: 0 },
    columnStyles: { 0: { fontStyle: 'bold', cellWidth: 90, textColor: colours.muted } },
  });

  // Three headline figures.
  const boxY = Math.max(w.y + 24, 470);
  const gap = 12;
  const boxW = (w.width - 2 * gap) / 3;
  const layout = layoutOf(survey, result);
  const t = layout?.totals ?? result.totals;
  const headline: [string, string][] = [
    ['Energy saved per year', fig.kwh(t.savings.kwhPerYear)],
    ['Money saved per year', fig.moneyWhole(t.money.totalPerYear)],
    ['Simple payback', fig.payback((layout?.economics ?? result.economics).simplePaybackYears)],
  ];
  headline.forEach(([label, value], i) => {
    const x = w.margin.left + i * (boxW + gap);
    w.doc.setFillColor(...colours.accentLight);
    w.doc.rect(x, boxY, boxW, 64, 'F');
    w.font(sizes.small, 'normal', colours.muted);
    w.textAt(label, x + 10, boxY + 18);
    w.font(sizes.heading + 2, 'bold', colours.accent);
    w.textAt(value, x + 10, boxY + 44, { maxWidth: boxW - 20 });
  });
  w.font(sizes.small, 'italic', colours.muted);
  const perLayout = layoutNote(survey, fig);
  w.textAt(
    `${perLayout ? `${perLayout} ` : ''}All figures are estimates from the survey data and published methods; see "Cautions and disclaimer" at the end.`,
    w.margin.left,
    boxY + 86,
    { maxWidth: w.width },
  );
}

/**
 * The rows of the summary's key-figures table, as printed (label, value).
 *
 * @example summaryRows(demo, result, figuresFor(demo))[0] //=> ['Energy saved per year (with HVAC interaction)', '10,637 kWh']
 */
export function summaryRows(survey: Survey, result: SurveyResult, fig: Figures): [string, string][] {
  // A repeated layout: every figure for all units, the surveyed unit's own in brackets where it differs in kind.
  const layout = layoutOf(survey, result);
  const t = layout?.totals ?? result.totals;
  const m = t.money;
  const e = layout?.economics ?? result.economics;
  const u = result.totals;
  const perUnit = (text: string): string => (layout ? ` (per unit: ${text})` : '');
  const rows: [string, string][] = [];
  if (layout) {
    const differing = layout.differingUnits;
    rows.push([
      'Units of this layout',
      `${fig.number(layout.units, 0)}${differing > 0 ? `, of which ${fig.number(differing, 0)} ${differing === 1 ? 'differs' : 'differ'} from the surveyed unit` : ''}`,
    ]);
  }
  rows.push(
    ['Energy saved per year (with HVAC interaction)', `${fig.kwh(t.savings.kwhPerYear)}${perUnit(fig.kwh(u.savings.kwhPerYear))}`],
    ['Lighting energy per year, now and after the swap', `${fig.kwh(t.existing.kwhPerYear)} now, ${fig.kwh(t.proposed.kwhPerYear)} after`],
    ['Peak demand reduction (coincident)', fig.kw(t.savings.peakKw)],
    ['Connected load reduction', fig.kw(t.savings.connectedKw)],
    ['Money saved in the first year', `${fig.money(m.totalPerYear)}${perUnit(fig.money(u.money.totalPerYear))}`],
    ['  of which energy, demand, maintenance', `${fig.money(m.energyPerYear)}, ${fig.money(m.demandPerYear)}, ${fig.money(m.maintenancePerYear)}`],
    ['Project cost before rebates', fig.money(m.cost.gross)],
    ['Rebates (estimated)', fig.money(m.cost.rebates)],
    ['Project cost net of rebates', `${fig.money(m.cost.net)}${perUnit(fig.money(u.money.cost.net))}`],
    ['Simple payback', fig.payback(e.simplePaybackYears)],
    [
      `Net present value (${survey.money.analysisYears} years at ${fig.percent(survey.money.discountRatePerYear)} real)`,
      fig.money(e.netPresentValue),
    ],
    ['Internal rate of return', fig.irr(e.internalRateOfReturn)],
    ['CO2 avoided per year', `${fig.co2(t.co2KgPerYear)}${perUnit(fig.co2(u.co2KgPerYear))}`],
  );
  if (t.savings.gasThermsPerYear < 0) {
    rows.push(['Extra heating gas per year (less waste heat from lighting)', `${fig.number(-t.savings.gasThermsPerYear, 0)} therms`]);
  }
  const c = result.warningCounts;
  rows.push([layout ? 'Warnings (in the surveyed unit)' : 'Warnings', `${c.danger} danger, ${c.caution} caution, ${c.advice} advice`]);
  return rows;
}

function summary(w: PdfWriter, survey: Survey, result: SurveyResult, fig: Figures): void {
  w.newPage();
  w.heading(reportSections.summary);
  const t = result.totals;
  w.paragraph(
    `${survey.site.name || survey.name}: ${fig.number(t.fixtures, 0)} fixtures in ${fig.number(t.rooms, 0)} rooms were surveyed. ` +
      'The proposal below replaces them room by room; the figures are yearly unless stated.' +
      (survey.layout ? ` ${layoutNote(survey, fig) ?? ''} The table below covers every unit; the room tables and charts describe the surveyed unit.` : ''),
  );
  w.table({
    body: summaryRows(survey, result, fig),
    theme: 'striped',
    styles: { fontSize: sizes.body },
    alternateRowStyles: { fillColor: colours.band },
    bodyStyles: { fillColor: [255, 255, 255] },
    columnStyles: { 0: { cellWidth: w.width * 0.52 }, 1: { fontStyle: 'bold' } },
  });
  w.paragraph(`Light quality. ${lightQualitySentence(result)}`, { after: 10 });
  drawKwhByRoomChart(w, result, fig);
  drawCashFlowChart(w, result, fig);
  w.paragraph(
    `The line adds each year's savings (energy price rising ${fig.percent(survey.money.energyEscalationPerYear)} a year above inflation) ` +
      'to the cost paid now, without discounting. Net present value discounts the same savings.',
    { size: sizes.small, colour: colours.muted },
  );
}

function roomOverview(w: PdfWriter, result: SurveyResult, fig: Figures): void {
  const t = result.totals;
  w.table({
    head: [['Room', 'Space type', 'Fixtures', 'kWh/yr now', 'kWh/yr after', 'kWh/yr saved', 'Saved/yr', 'Net cost', 'Payback']],
    body: result.rooms.map((r) => [
      r.name,
      r.spaceLabel,
      fig.number(r.fixtures, 0),
      fig.number(r.existing.kwhPerYear, 0),
      fig.number(r.proposed.kwhPerYear, 0),
      fig.number(r.savings.kwhPerYear, 0),
      fig.money(r.money.totalPerYear),
      fig.money(r.money.cost.net),
      fig.paybackShort(r.money.simplePaybackYears),
    ]),
    foot: [
      [
        'Total',
        '',
        fig.number(t.fixtures, 0),
        fig.number(t.existing.kwhPerYear, 0),
        fig.number(t.proposed.kwhPerYear, 0),
        fig.number(t.savings.kwhPerYear, 0),
        fig.money(t.money.totalPerYear),
        fig.money(t.money.cost.net),
        fig.paybackShort(result.economics.simplePaybackYears),
      ].map((content, i) => ({ content, styles: { halign: i >= 2 ? ('right' as const) : ('left' as const) } })),
    ],
    showFoot: 'lastPage',
    columnStyles: {
      2: { halign: 'right' },
      3: { halign: 'right' },
      4: { halign: 'right' },
      5: { halign: 'right' },
      6: { halign: 'right' },
      7: { halign: 'right' },
      8: { halign: 'right' },
    },
  });
}

function roomDetail(w: PdfWriter, survey: Survey, result: SurveyResult, roomIndex: number, fig: Figures): void {
  const room = result.rooms[roomIndex]!;
  w.ensureSpace(90);
  w.subheading(room.name);
  w.paragraph(
    `${room.spaceLabel} \u00b7 ${fig.quantity('area', room.adequacy.floorSquareMetres)} \u00b7 ${fig.number(room.hoursPerYear, 0)} hours a year \u00b7 ${fig.number(room.fixtures, 0)} ${room.fixtures === 1 ? 'fixture' : 'fixtures'}`,
    { size: sizes.small, colour: colours.muted, after: 2 },
  );
  if (room.entries.length === 0) {
    w.paragraph('No fixtures logged in this room.', { size: sizes.small });
    return;
  }
  w.table({
    head: [entryTableHead],
    body: roomEntryRows(survey, result, roomIndex, fig),
    columnStyles: entryColumnStyles,
  });
}

/** How each light verdict reads in the adequacy table. */
export const verdictWords: Readonly<Record<LightVerdict, string>> = {
  ok: 'Meets target',
  short: 'Below target',
  over: 'Well above target',
  unknown: 'Not estimated (lumens missing)',
  'no-proposal': 'No change proposed',
};

/**
 * The rows of the light adequacy table, as printed, in the survey's units.
 *
 * @example adequacyRows(result, figuresFor(demo))[0][2] //=> '50.0 fc'
 */
export function adequacyRows(result: SurveyResult, fig: Figures): string[][] {
  return result.rooms.map((r) => {
    const a = r.adequacy;
    const lux = (value: number | null) => (value === null ? '\u2013' : fig.quantity('illuminance', value));
    const ratio = a.proposedLux === null || a.targetLux <= 0 ? '\u2013' : fig.percent(a.proposedLux / a.targetLux, 0);
    return [
      r.name,
      fig.quantity('area', a.floorSquareMetres),
      fig.quantity('illuminance', a.targetLux),
      lux(a.existingLux),
      lux(a.proposedLux),
      ratio,
      fig.quantity('powerDensity', a.allowanceWattsPerSquareMetre),
      fig.quantity('powerDensity', a.proposedWattsPerSquareMetre),
      `${verdictWords[lightVerdict(r)]}; ${a.proposedWithinAllowance ? 'power density within allowance' : 'power density over allowance'}`,
    ];
  });
}

function adequacy(w: PdfWriter, result: SurveyResult, fig: Figures): void {
  w.heading(reportSections.adequacy);
  w.paragraph(
    `Estimated maintained illuminance on the work plane by the lumen method, against the recommended level for each space type ` +
      `(IES recommendations), and the lighting power density against the ASHRAE/IES 90.1-2019 space-by-space allowance. ` +
      `Illuminance in ${fig.unit('illuminance')}, areas in ${fig.unit('area')}, power density in ${fig.unit('powerDensity')}.`,
    { size: sizes.small },
  );
  w.table({
    head: [['Room', 'Floor area', 'Light target', 'Light now', 'Light after', 'After vs target', 'LPD allowance', 'LPD after', 'Verdict']],
    body: adequacyRows(result, fig),
    columnStyles: {
      1: { halign: 'right' },
      2: { halign: 'right' },
      3: { halign: 'right' },
      4: { halign: 'right' },
      5: { halign: 'right' },
      6: { halign: 'right' },
      7: { halign: 'right' },
      8: { cellWidth: 110 },
    },
  });
  // Notes shared by every room are said once; room-specific ones list their rooms.
  const byNote = new Map<string, string[]>();
  for (const r of result.rooms) {
    for (const n of r.adequacy.notes) {
      if (n.startsWith('Lumen method with fixtures at the ceiling') || n.startsWith('Coefficients of utilisation from the table')) continue;
      byNote.set(n, [...(byNote.get(n) ?? []), r.name]);
    }
  }
  w.paragraph('Notes on these estimates:', { size: sizes.small, style: 'bold', after: 2 });
  w.bullet(
    "Fixtures are taken at the ceiling. Coefficients of utilisation come from a table by each fixture's light distribution at 80/50/20 % ceiling, wall and floor reflectances; the product's own photometry is better.",
    sizes.small,
  );
  for (const [note, rooms] of byNote) w.bullet(rooms.length === result.rooms.length ? note : `${note} (${rooms.join(', ')})`, sizes.small);
}

interface Place {
  roomName: string;
  where: string;
}

function placesOf(survey: Survey, result: SurveyResult): { entries: Map<string, Place>; rooms: Map<string, string> } {
  const entries = new Map<string, Place>();
  const rooms = new Map<string, string>();
  result.rooms.forEach((room: RoomResult) => {
    rooms.set(room.roomId, room.name);
    room.entries.forEach((e: EntryResult) => {
      const what = e.description.trim() === '' ? `${e.count} fixtures` : `${e.count} \u00d7 ${e.description}`;
      entries.set(e.entryId, { roomName: room.name, where: `${room.name}: ${what}` });
    });
  });
  void survey;
  return { entries, rooms };
}

/** Occurrences of one warning code within a severity. */
export interface WarningGroup {
  severity: Severity;
  code: Warning['code'];
  title: string;
  items: Warning[];
}

/**
 * Groups warnings by severity (most serious first) and then by code, in the
 * order they first appear.
 *
 * @example groupWarnings(result.warnings)[0].severity //=> 'danger'
 */
export function groupWarnings(warnings: readonly Warning[]): WarningGroup[] {
  const groups = new Map<string, WarningGroup>();
  for (const w of warnings) {
    const key = `${w.severity}|${w.code}|${w.title}`;
    let group = groups.get(key);
    if (!group) {
      group = { severity: w.severity, code: w.code, title: w.title, items: [] };
      groups.set(key, group);
    }
    group.items.push(w);
  }
  const rank: Record<Severity, number> = { danger: 0, caution: 1, advice: 2 };
  return [...groups.values()].sort((a, b) => rank[a.severity] - rank[b.severity]);
}

/** Groups with more occurrences than this are summarised in one row listing where they occur. */
export const maxListedOccurrences = 6;

function warningLocation(w: Warning, places: ReturnType<typeof placesOf>): string {
  if (w.entryId !== undefined) return places.entries.get(w.entryId)?.where ?? w.entryId;
  if (w.circuitLabel !== undefined) return `Circuit ${w.circuitLabel}`;
  if (w.roomId !== undefined) return `${places.rooms.get(w.roomId) ?? w.roomId} (whole room)`;
  return 'Whole survey';
}

function summarisedLocations(items: readonly Warning[], places: ReturnType<typeof placesOf>): string {
  const counts = new Map<string, number>();
  for (const w of items) {
    const name =
      w.entryId !== undefined
        ? (places.entries.get(w.entryId)?.roomName ?? w.entryId)
        : w.circuitLabel !== undefined
          ? `Circuit ${w.circuitLabel}`
          : (places.rooms.get(w.roomId ?? '') ?? 'Survey');
    counts.set(name, (counts.get(name) ?? 0) + 1);
  }
  const list = [...counts.entries()];
  const shown = list.slice(0, 12).map(([name, n]) => (n > 1 ? `${name} (${n})` : name));
  const more = list.length - shown.length;
  return `${items.length} places in ${list.length} rooms or circuits: ${shown.join(', ')}${more > 0 ? ` and ${more} more` : ''}`;
}

function warningsSection(w: PdfWriter, survey: Survey, result: SurveyResult): void {
  w.heading(reportSections.warnings, 190);
  const all = result.warnings;
  if (all.length === 0) {
    w.paragraph('No warnings: nothing in the survey calls for a change of product or plan.');
    return;
  }
  w.paragraph(
    'Each problem found, where it is, and what to do. Anything about wiring, heat or emergency lighting defers to local codes and a licensed electrician.',
    { size: sizes.small },
  );
  const places = placesOf(survey, result);
  const groups = groupWarnings(all);
  for (const severity of ['danger', 'caution', 'advice'] as const) {
    const mine = groups.filter((g) => g.severity === severity);
    if (mine.length === 0) continue;
    const count = mine.reduce((n, g) => n + g.items.length, 0);
    w.ensureSpace(70);
    w.y += 4;
    w.font(sizes.subheading, 'bold', severityColours[severity]);
    w.y += sizes.subheading;
    w.textAt(`${severityHeadings[severity]} (${count})`, w.margin.left, w.y);
    w.y += 6;
    const body: RowInput[] = [];
    for (const group of mine) {
      const titleRow: CellDef = {
        content: group.items.length > 1 ? `${group.title} (${group.items.length})` : group.title,
        colSpan: 3,
        styles: { fontStyle: 'bold', fillColor: colours.band, textColor: severityColours[severity] },
      };
      body.push([titleRow]);
      if (group.items.length <= maxListedOccurrences) {
        let i = 0;
        while (i < group.items.length) {
          // Consecutive occurrences with the same action share one "What to do" cell.
          let j = i + 1;
          while (j < group.items.length && group.items[j]!.action === group.items[i]!.action) j++;
          for (let k = i; k < j; k++) {
            const item = group.items[k]!;
            const row: RowInput = [warningLocation(item, places), item.message];
            if (k === i) row.push({ content: item.action, rowSpan: j - i });
            body.push(row);
          }
          i = j;
        }
      } else {
        const first = group.items[0]!;
        const sameAction = group.items.every((x) => x.action === first.action);
        body.push([
          summarisedLocations(group.items, places),
          `For example: ${first.message}`,
          sameAction ? first.action : `${first.action} (the action differs between places; see the fixture schedule)`,
        ]);
      }
    }
    w.table({
      head: [['Where', 'What was found', 'What to do']],
      body,
      headStyles: { fillColor: severityColours[severity] },
      columnStyles: { 0: { cellWidth: 130 }, 2: { cellWidth: 170 } },
    });
  }
}

function photos(w: PdfWriter, settings: ReportSettings): void {
  const list = settings.photos ?? [];
  if (list.length === 0) return;
  w.heading(reportSections.photos);
  const gap = 14;
  const perRow = 3;
  const cellW = (w.width - gap * (perRow - 1)) / perRow;
  const boxH = 120;
  list.forEach((photo, i) => {
    const format = checkImage(photo, `photos[${i}]`);
    const col = i % perRow;
    if (col === 0) w.ensureSpace(boxH + 40);
    const x = w.margin.left + col * (cellW + gap);
    const scale = Math.min(cellW / photo.width, boxH / photo.height);
    const iw = photo.width * scale;
    const ih = photo.height * scale;
    w.doc.setFillColor(...colours.band);
    w.doc.rect(x, w.y, cellW, boxH, 'F');
    w.doc.addImage(photo.dataUrl, format, x + (cellW - iw) / 2, w.y + (boxH - ih) / 2, iw, ih, undefined, 'FAST');
    w.font(sizes.small, 'normal', colours.ink);
    const lines = w.wrap(photo.caption, cellW).slice(0, 3);
    w.doc.text(lines, x, w.y + boxH + 11);
    if (col === perRow - 1 || i === list.length - 1) w.y += boxH + 14 + 3 * w.lineHeight(sizes.small);
  });
}

/**
 * The published sources behind the defaults, as printed.
 *
 * @example publishedSources(result)[1] //=> 'HVAC interaction: Bonneville Power Administration, …'
 */
export function publishedSources(result: SurveyResult): string[] {
  return [
    'Savings method: US DOE Uniform Methods Project, Chapter 2, "Commercial and Industrial Lighting Evaluation Protocol" (NREL/SR-7A40-68558, 2017): energy saved = change in connected load \u00d7 hours \u00d7 HVAC interactive factor; peak demand saved = change in load \u00d7 coincidence factor \u00d7 HVAC demand factor.',
    'HVAC interaction: Bonneville Power Administration, "HVAC Interactive Effects" (2012), lighting-savings yield and gas heating penalty by building and heating type.',
    'Power density allowances: ASHRAE/IES Standard 90.1-2019, Table 9.6.1 (space-by-space method). Occupancy-sensor savings: ASHRAE/IES 90.1-2019 Appendix G, Table G3.7.',
    'Recommended light levels: IES Lighting Handbook recommendations (9th-edition summary of recommended illuminance) and US 41 CFR 102-74.180 for federal work areas.',
    `Grid emission factor: ${result.factors.sources.grid}. Built-in factors are US EPA eGRID2022 (EPA GHG Emission Factors Hub 2024, Table 6) and the UK Government GHG conversion factors for company reporting.`,
    'Economics: NIST Handbook 135, Life-Cycle Costing Manual for the Federal Energy Management Program: present values, net savings (NPV), savings-to-investment ratio; IRR is searched over all rates and reported honestly when there is none or more than one.',
    'Circuit loading: US National Electrical Code 210.20(A), continuous loads at most 80 % of the breaker rating.',
  ];
}

/**
 * The assumptions table rows, as printed (assumption, value, source).
 *
 * @example assumptionRows(demo, result, figuresFor(demo))[0] //=> ['Energy price', '$0.16 per kWh', 'entered for this survey']
 */
export function assumptionRows(survey: Survey, result: SurveyResult, fig: Figures): [string, string, string][] {
  const m = survey.money;
  const f = result.factors;
  const user = 'entered for this survey';
  return [
    ['Energy price', `${fig.money(m.energyRatePerKwh)} per kWh`, user],
    ['Demand charge', `${fig.money(m.demandChargePerKwMonth)} per kW-month`, user],
    ['Energy price escalation (real)', `${fig.percent(m.energyEscalationPerYear)} a year`, user],
    ['Discount rate (real)', `${fig.percent(m.discountRatePerYear)} a year`, `${user}; method NIST Handbook 135`],
    ['Analysis period', `${m.analysisYears} years`, user],
    ['Labour rate', `${fig.money(m.labourRatePerHour)} per hour`, user],
    ['Markup', fig.percent(m.markupFraction), user],
    ['Sales tax', `${fig.percent(m.taxFraction)} on ${m.taxBase === 'materials' ? 'materials' : 'everything'}`, user],
    ['HVAC interactive factor, energy', fig.number(f.hvacEnergyFactor, 2), f.sources.hvac],
    [
      'HVAC interactive factor, demand',
      fig.number(f.hvacDemandFactor, 2),
      survey.savings.hvacDemandFactor !== undefined ? 'entered by the user' : 'no published default adopted; 1.00 means no interaction',
    ],
    ['Peak coincidence factor', fig.number(f.coincidenceFactor, 2), f.sources.operating],
    ['Gas heating penalty', f.gasThermsPerKwhSaved === 0 ? 'none' : `${fig.number(f.gasThermsPerKwhSaved, 5)} therms per kWh saved`, f.sources.hvac],
    ['Grid emission factor', `${fig.number(f.kgCo2PerKwh, 4)} kg CO2 per kWh`, f.sources.grid],
  ];
}

function assumptions(w: PdfWriter, survey: Survey, result: SurveyResult, fig: Figures): void {
  w.heading(reportSections.assumptions);
  w.table({
    head: [['Assumption', 'Value', 'Where it comes from']],
    body: assumptionRows(survey, result, fig),
    columnStyles: { 0: { cellWidth: 140 }, 1: { cellWidth: 120 } },
  });
  w.paragraph('Hours of use by room are those recorded in the survey (or the building-type default where none was recorded).', {
    size: sizes.small,
  });
  w.subheading('Published sources');
  for (const source of publishedSources(result)) w.bullet(source, sizes.small);
}

/** The cautions printed at the end of the report. */
export const reportCautions: readonly string[] = [
  'These figures are estimates, not guarantees. Actual savings depend on real hours of use, energy prices, weather, the products installed and how the building is run.',
  'Light levels are estimated by the lumen method with typical room surfaces and dirt allowances. Confirm the final design with a photometric calculation where light levels matter.',
  `Wiring work (ballast removal or bypass, conversion kits, new luminaires, emergency lighting): ${safetyDeferral}`,
  'Check every product\u2019s listing for the place it goes: enclosed fixtures, damp or wet locations, contact with insulation, dimmers and emergency circuits.',
  'Removed fluorescent and HID lamps contain mercury, and ballasts made through 1979 may contain PCBs: handle and dispose of them under local hazardous-waste rules.',
  'Rebates are estimates and depend on the program\u2019s rules and approval. Prices, tariffs and emission factors change over time.',
];

function disclaimer(w: PdfWriter): void {
  w.heading(reportSections.disclaimer);
  for (const caution of reportCautions) w.bullet(caution);
  w.y += 6;
  w.paragraph(
    'This report supports a decision; it is not a design, a specification or a promise of results. The people who install the work are responsible for doing it safely and to code.',
    { size: sizes.small, style: 'italic', colour: colours.muted },
  );
}

/**
 * Makes the client report PDF. Rejects with an `AbortError` when `signal` is
 * aborted, and with a `CalcInputError` naming `logo.*` or `photos[i].*` for
 * an image that is not a PNG or JPEG data URL with a positive size.
 *
 * @example await clientReportPdf(new AbortController().signal, { survey, result }, { companyName: 'Brightwell Audits', date: new Date() }) //=> Uint8Array (a PDF)
 */
export async function clientReportPdf(
  signal: AbortSignal,
  input: ExportInput,
  settings: ReportSettings,
  onProgress?: ProgressCallback,
): Promise<Uint8Array> {
  const { survey, result } = input;
  const progress = progressReporter(onProgress);
  progress(0);
  await pause(signal);
  if (settings.logo) checkImage(settings.logo, 'logo');
  (settings.photos ?? []).forEach((p, i) => checkImage(p, `photos[${i}]`));
  const fig = figuresFor(survey);
  const w = new PdfWriter(settings.paper ?? paperFor(survey.locale));
  cover(w, survey, result, settings, fig);
  summary(w, survey, result, fig);
  progress(0.1);
  await pause(signal);

  w.newPage();
  w.heading(reportSections.rooms);
  roomOverview(w, result, fig);
  const rooms = result.rooms.length;
  for (let i = 0; i < rooms; i++) {
    roomDetail(w, survey, result, i, fig);
    if (i % 5 === 4) {
      progress(0.1 + (0.6 * (i + 1)) / rooms);
      await pause(signal);
    }
  }
  progress(0.7);
  await pause(signal);
  adequacy(w, result, fig);
  progress(0.75);
  await pause(signal);
  warningsSection(w, survey, result);
  progress(0.85);
  await pause(signal);
  photos(w, settings);
  assumptions(w, survey, result, fig);
  disclaimer(w);
  w.decorate(`${reportTitle} \u2014 ${survey.site.name || survey.name}`, `${settings.companyName} \u00b7 ${fig.date(settings.date)}`);
  progress(0.9);
  await pause(signal);
  const bytes = w.bytes();
  progress(1);
  return bytes;
}

/** The client report exporter. */
export const clientReport: Exporter<ReportSettings> = pdfExporter('client-report', 'Client report (PDF)', 'report', clientReportPdf);
