/**
 * Two small charts drawn here in SVG (no chart library): energy per room
 * before and after, and the cumulative cash flow crossing zero at payback.
 * Each has a text summary for screen readers; the numbers are also in the
 * lists beside them.
 */
import type { CashFlowYear } from '../../calc/economics.ts';
import type { RoomResult } from '../../calc/survey.ts';
import type { UiFigures } from '../state/format.ts';

const width = 320;

function shorten(name: string, max = 18): string {
  return name.length > max ? `${name.slice(0, max - 1)}…` : name;
}

/**
 * Existing and proposed kWh/yr of the rooms saving most (up to 6).
 *
 * @example <RoomEnergyChart rooms={result.rooms} fig={fig} /> //=> paired bars for up to six rooms
 */
export function RoomEnergyChart(props: { rooms: readonly RoomResult[]; fig: UiFigures }) {
  const rooms = [...props.rooms].sort((a, b) => b.savings.kwhPerYear - a.savings.kwhPerYear).slice(0, 6);
  if (rooms.length === 0) return null;
  const max = Math.max(1, ...rooms.map((room) => Math.max(room.existing.kwhPerYear, room.proposed.kwhPerYear)));
  const labelWidth = 118;
  const barSpace = width - labelWidth - 8;
  const rowHeight = 34;
  const height = rooms.length * rowHeight + 26;
  const summary = rooms
    .map((room) => `${room.name}: ${props.fig.kwhPerYear(room.existing.kwhPerYear)} now, ${props.fig.kwhPerYear(room.proposed.kwhPerYear)} after`)
    .join('; ');
  return (
    <figure class="chart">
      <svg viewBox={`0 0 ${width} ${height}`} role="img" aria-label={`Energy per room, now and after the swap. ${summary}.`}>
        {rooms.map((room, index) => {
          const y = index * rowHeight + 4;
          const now = (room.existing.kwhPerYear / max) * barSpace;
          const after = (Math.max(0, room.proposed.kwhPerYear) / max) * barSpace;
          return (
            <g key={room.roomId}>
              <text x={0} y={y + 17} class="chart-label">
                {shorten(room.name)}
              </text>
              <rect x={labelWidth} y={y + 2} width={Math.max(1, now)} height={11} class="chart-now" rx={2} />
              <rect x={labelWidth} y={y + 15} width={Math.max(1, after)} height={11} class="chart-after" rx={2} />
            </g>
          );
        })}
        <g transform={`translate(${labelWidth}, ${height - 12})`}>
          <rect x={0} y={-8} width={10} height={10} class="chart-now" />
          <text x={14} y={1} class="chart-key">
            now
          </text>
          <rect x={60} y={-8} width={10} height={10} class="chart-after" />
          <text x={74} y={1} class="chart-key">
            after (kWh/yr)
          </text>
        </g>
      </svg>
      <figcaption class="visually-hidden">Energy per room</figcaption>
    </figure>
  );
}

/**
 * Cumulative cash flow, year 0 to the end of the study period.
 *
 * @example <CashFlowChart years={result.economics.cashFlows} paybackYears={0.9} fig={fig} /> //=> a rising line crossing zero at 0.9 years
 */
export function CashFlowChart(props: { years: readonly CashFlowYear[]; paybackYears: number | null; fig: UiFigures }) {
  const years = props.years;
  if (years.length < 2) return null;
  const height = 150;
  const left = 56;
  const right = 8;
  const top = 10;
  const bottom = 26;
  const values = years.map((year) => year.cumulative);
  const low = Math.min(0, ...values);
  const high = Math.max(0, ...values);
  const span = high - low || 1;
  const last = years.length - 1;
  const x = (year: number) => left + (year / last) * (width - left - right);
  const y = (value: number) => top + ((high - value) / span) * (height - top - bottom);
  const points = years.map((year) => `${x(year.year).toFixed(1)},${y(year.cumulative).toFixed(1)}`).join(' ');
  const payback = props.paybackYears;
  const end = years[last]!;
  return (
    <figure class="chart">
      <svg
        viewBox={`0 0 ${width} ${height}`}
        role="img"
        aria-label={`Cumulative cash flow: starts at ${props.fig.money(years[0]!.cumulative)}, ends at ${props.fig.money(end.cumulative)} after ${end.year} years${payback !== null ? `, crossing zero at ${props.fig.number(payback, 1)} years` : ''}.`}
      >
        <line x1={left} x2={width - right} y1={y(0)} y2={y(0)} class="chart-axis" />
        <text x={left - 4} y={y(high) + 4} class="chart-key" text-anchor="end">
          {props.fig.money(high)}
        </text>
        <text x={left - 4} y={y(low) + 4} class="chart-key" text-anchor="end">
          {props.fig.money(low)}
        </text>
        <polyline points={points} class="chart-line" />
        {payback !== null && payback <= end.year && payback > 0 && (
          <g>
            <line x1={x(payback)} x2={x(payback)} y1={top} y2={height - bottom} class="chart-marker" />
            <text x={Math.min(x(payback) + 4, width - 90)} y={top + 10} class="chart-key">
              pays back {props.fig.number(payback, 1)} yr
            </text>
          </g>
        )}
        <text x={left} y={height - 8} class="chart-key">
          year 0
        </text>
        <text x={width - right} y={height - 8} class="chart-key" text-anchor="end">
          year {end.year}
        </text>
      </svg>
      <figcaption class="visually-hidden">Cumulative cash flow</figcaption>
    </figure>
  );
}
