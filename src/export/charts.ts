/**
 * Charts drawn with jsPDF's own lines, rectangles and text (no images, no
 * canvas), so they print sharply and cost little: annual kWh before and after
 * by room as paired bars, and the cumulative cash flow of the project year by
 * year with the point where it crosses zero.
 */
import type { CashFlowYear } from '../calc/economics.ts';
import type { SurveyResult } from '../calc/survey.ts';
import type { Figures } from './figures.ts';
import { colours, sizes, type PdfWriter } from './pdf.ts';

/**
 * A "nice" tick step (1, 2, 2.5 or 5 × a power of ten) that splits `range`
 * into about `ticks` parts.
 *
 * @example niceStep(4200, 5) //=> 1000
 */
export function niceStep(range: number, ticks = 5): number {
  if (!(range > 0) || !Number.isFinite(range)) return 1;
  const raw = range / ticks;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const normal = raw / magnitude;
  const factor = normal <= 1 ? 1 : normal <= 2 ? 2 : normal <= 2.5 ? 2.5 : normal <= 5 ? 5 : 10;
  return factor * magnitude;
}

/** At most this many rooms get a pair of bars; the others are summed in a line under the chart. */
export const maxChartRooms = 15;

interface BarRow {
  label: string;
  existing: number;
  proposed: number;
}

/**
 * The rows of the kWh-by-room chart: every room when there are at most
 * {@link maxChartRooms}, otherwise the rooms using most energy now, with the
 * rest summed in `others` (drawn as a note, not a bar, so one large sum does
 * not squash every bar).
 *
 * @example kwhChartRows(result).rows.length //=> 6 for the demo survey
 */
export function kwhChartRows(result: SurveyResult): { rows: BarRow[]; others: (BarRow & { rooms: number }) | null } {
  const rows = result.rooms.map((r) => ({ label: r.name, existing: r.existing.kwhPerYear, proposed: r.proposed.kwhPerYear }));
  if (rows.length <= maxChartRooms) return { rows, others: null };
  const sorted = [...rows].sort((a, b) => b.existing - a.existing);
  const rest = sorted.slice(maxChartRooms);
  return {
    rows: sorted.slice(0, maxChartRooms),
    others: {
      label: `${rest.length} other rooms`,
      rooms: rest.length,
      existing: rest.reduce((sum, r) => sum + r.existing, 0),
      proposed: rest.reduce((sum, r) => sum + r.proposed, 0),
    },
  };
}

function ellipsize(w: PdfWriter, text: string, width: number): string {
  const lines = w.wrap(text, width);
  const first = lines[0] ?? '';
  return lines.length > 1 ? `${first.replace(/\s+\S*$/, '')}\u2026` : first;
}

function legend(w: PdfWriter, x: number, y: number, items: readonly { label: string; colour: [number, number, number] }[]): void {
  let cx = x;
  w.font(sizes.small, 'normal', colours.muted);
  for (const item of items) {
    w.doc.setFillColor(...item.colour);
    w.doc.rect(cx, y - 7, 9, 9, 'F');
    w.textAt(item.label, cx + 13, y);
    cx += 13 + w.doc.getTextWidth(item.label) + 18;
  }
}

/**
 * Draws the existing vs proposed kWh per year bars by room at the cursor.
 *
 * @example drawKwhByRoomChart(writer, result, figuresFor(survey)) // writer.y moves below the chart
 */
export function drawKwhByRoomChart(w: PdfWriter, result: SurveyResult, fig: Figures): void {
  const { rows, others } = kwhChartRows(result);
  const barHeight = 7;
  const rowHeight = 2 * barHeight + 7;
  const height = 22 + rows.length * rowHeight + 26;
  w.ensureSpace(height + 24);
  w.subheading('Energy use by room, kWh per year: now and after the swap');
  const top = w.y;
  legend(w, w.margin.left, top + 8, [
    { label: 'Now', colour: colours.existing },
    { label: 'After the swap', colour: colours.accent },
  ]);
  const labelWidth = Math.min(140, w.width * 0.3);
  const x0 = w.margin.left + labelWidth + 6;
  const x1 = w.margin.left + w.width - 58;
  const plotTop = top + 20;
  const plotBottom = plotTop + rows.length * rowHeight;
  const max = Math.max(1, ...rows.map((r) => Math.max(r.existing, r.proposed)));
  const step = niceStep(max, 5);
  const axisMax = Math.ceil(max / step) * step;
  const scale = (x1 - x0) / axisMax;

  // Grid and axis labels.
  w.doc.setLineWidth(0.4);
  w.font(sizes.small - 1, 'normal', colours.muted);
  for (let v = 0; v <= axisMax + step / 2; v += step) {
    const x = x0 + v * scale;
    w.doc.setDrawColor(...colours.rule);
    w.doc.line(x, plotTop - 2, x, plotBottom);
    w.textAt(fig.number(v, 0), x, plotBottom + 10, { align: 'center' });
  }
  w.doc.setDrawColor(...colours.muted);
  w.doc.line(x0, plotTop - 2, x0, plotBottom);

  rows.forEach((row, i) => {
    const y = plotTop + i * rowHeight + 2;
    w.font(sizes.small, 'normal', colours.ink);
    w.textAt(ellipsize(w, row.label, labelWidth), w.margin.left, y + barHeight + 3);
    w.doc.setFillColor(...colours.existing);
    w.doc.rect(x0, y, Math.max(0.5, row.existing * scale), barHeight, 'F');
    w.doc.setFillColor(...colours.accent);
    w.doc.rect(x0, y + barHeight, Math.max(0.5, row.proposed * scale), barHeight, 'F');
    w.font(sizes.small - 1.5, 'normal', colours.muted);
    w.textAt(fig.number(row.existing, 0), x0 + row.existing * scale + 3, y + barHeight - 1);
    w.textAt(fig.number(row.proposed, 0), x0 + row.proposed * scale + 3, y + 2 * barHeight - 1);
  });
  w.font(sizes.small - 1, 'normal', colours.muted);
  w.textAt('kWh per year', w.margin.left, plotBottom + 10);
  w.y = plotBottom + 26;
  if (others) {
    w.paragraph(
      `The ${fig.number(rows.length, 0)} rooms using most energy now are shown; the ${fig.number(others.rooms, 0)} other rooms together use ` +
        `${fig.kwh(others.existing)} a year now and ${fig.kwh(others.proposed)} after the swap.`,
      { size: sizes.small, colour: colours.muted },
    );
  }
  w.font(sizes.body);
}

/**
 * The point where a cumulative cash flow first turns from negative to zero
 * or above, by straight-line interpolation between year ends; `0` when it
 * never starts negative, `null` when it stays negative.
 *
 * @example breakEvenYears([{ year: 0, cumulative: -100 }, { year: 1, cumulative: -50 }, { year: 2, cumulative: 0 }]) //=> 2
 */
export function breakEvenYears(flows: readonly Pick<CashFlowYear, 'year' | 'cumulative'>[]): number | null {
  const first = flows[0];
  if (!first) return null;
  if (first.cumulative >= 0) return 0;
  for (let i = 1; i < flows.length; i++) {
    const before = flows[i - 1]!;
    const now = flows[i]!;
    if (now.cumulative >= 0) {
      return before.year + (0 - before.cumulative) / (now.cumulative - before.cumulative);
    }
  }
  return null;
}

/**
 * Draws the cumulative cash flow line, with its zero crossing, at the cursor.
 *
 * @example drawCashFlowChart(writer, result, figuresFor(survey)) // writer.y moves below the chart
 */
export function drawCashFlowChart(w: PdfWriter, result: SurveyResult, fig: Figures): void {
  const flows = result.economics.cashFlows;
  const plotHeight = 170;
  w.ensureSpace(plotHeight + 80);
  w.subheading('Cumulative cash flow: cost now, savings each year');
  const top = w.y + 4;
  const x0 = w.margin.left + 62;
  const x1 = w.margin.left + w.width - 10;
  const yTop = top;
  const yBottom = top + plotHeight;
  const values = flows.map((f) => f.cumulative);
  const low = Math.min(0, ...values);
  const high = Math.max(0, ...values);
  const step = niceStep(high - low || 1, 5);
  const axisLow = Math.floor(low / step) * step;
  const axisHigh = Math.ceil(high / step) * step || step;
  const years = Math.max(1, flows.length - 1);
  const xOf = (year: number) => x0 + (year / years) * (x1 - x0);
  const yOf = (value: number) => yBottom - ((value - axisLow) / (axisHigh - axisLow)) * (yBottom - yTop);

  w.doc.setLineWidth(0.4);
  w.font(sizes.small - 1, 'normal', colours.muted);
  for (let v = axisLow; v <= axisHigh + step / 2; v += step) {
    const y = yOf(v);
    w.doc.setDrawColor(...colours.rule);
    w.doc.line(x0, y, x1, y);
    w.textAt(fig.moneyWhole(v), x0 - 4, y + 2.5, { align: 'right' });
  }
  const yearStep = years > 20 ? 5 : years > 10 ? 2 : 1;
  for (let year = 0; year <= years; year += yearStep) {
    w.textAt(String(year), xOf(year), yBottom + 10, { align: 'center' });
  }
  w.textAt('years from now', x1, yBottom + 20, { align: 'right' });
  // Zero line.
  w.doc.setDrawColor(...colours.ink);
  w.doc.setLineWidth(0.8);
  w.doc.line(x0, yOf(0), x1, yOf(0));

  // The line and its points.
  w.doc.setDrawColor(...colours.accent);
  w.doc.setLineWidth(1.6);
  for (let i = 1; i < flows.length; i++) {
    const a = flows[i - 1]!;
    const b = flows[i]!;
    w.doc.line(xOf(a.year), yOf(a.cumulative), xOf(b.year), yOf(b.cumulative));
  }
  w.doc.setFillColor(...colours.accent);
  for (const f of flows) w.doc.circle(xOf(f.year), yOf(f.cumulative), 1.8, 'F');

  const crossing = breakEvenYears(flows);
  w.font(sizes.small, 'bold', colours.ink);
  if (crossing !== null && crossing > 0) {
    const x = xOf(crossing);
    w.doc.setDrawColor(...colours.ink);
    w.doc.setLineWidth(0.6);
    w.doc.setLineDashPattern([3, 2], 0);
    w.doc.line(x, yTop, x, yBottom);
    w.doc.setLineDashPattern([], 0);
    w.doc.setFillColor(255, 255, 255);
    w.doc.circle(x, yOf(0), 3, 'FD');
    const label = `Break-even after about ${fig.number(crossing, 1)} years`;
    const right = x + 6 + w.doc.getTextWidth(label) < x1;
    w.textAt(label, right ? x + 6 : x - 6, yTop + 10, { align: right ? 'left' : 'right' });
  } else if (crossing === 0) {
    w.textAt('Rebates cover the cost: the project is ahead from the start', x0 + 6, yTop + 10);
  } else {
    w.textAt(`The savings do not repay the cost within ${years} years`, x0 + 6, yTop + 10);
  }
  w.y = yBottom + 28;
  w.font(sizes.body);
}
