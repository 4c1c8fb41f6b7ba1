/**
 * The phased plan as a small SVG chart (drawn here, like `charts.tsx`): each
 * year's spending and savings as paired bars, and the cumulative cash flow as
 * a line crossing zero when the plan has paid for itself. A text summary
 * stands in for screen readers; the numbers are also in the table beside it.
 */
import type { PhaseYear } from '../../calc/phasing.ts';
import type { UiFigures } from '../state/format.ts';

const width = 320;

/**
 * Spending, savings and cumulative cash flow per plan year.
 *
 * @example <PlanChart years={plan.years} fig={fig} /> //=> paired bars per year and a cumulative line
 */
export function PlanChart(props: { years: readonly PhaseYear[]; fig: UiFigures }) {
  const { years, fig } = props;
  if (years.length === 0) return null;
  const height = 170;
  const left = 58;
  const right = 8;
  const top = 10;
  const bottom = 40;
  const values = years.flatMap((year) => [year.cost, year.savings, year.cumulativeCashFlow, -year.cost]);
  const low = Math.min(0, ...values.filter(Number.isFinite));
  const high = Math.max(0, ...values.filter(Number.isFinite));
  const span = high - low || 1;
  const slot = (width - left - right) / years.length;
  const bar = Math.max(2, Math.min(18, slot / 3));
  const y = (value: number) => top + ((high - value) / span) * (height - top - bottom);
  const centre = (index: number) => left + slot * index + slot / 2;
  const points = years.map((year, index) => `${centre(index).toFixed(1)},${y(year.cumulativeCashFlow).toFixed(1)}`).join(' ');
  const last = years[years.length - 1]!;
  const summary = years.map((year) => `year ${year.year}: spend ${fig.money(year.cost)}, save ${fig.money(year.savings)}, cumulative ${fig.money(year.cumulativeCashFlow)}`).join('; ');
  const label = `Plan by year. ${summary}. After year ${last.year} the cumulative cash flow is ${fig.money(last.cumulativeCashFlow)}.`;
  return (
    <figure class="chart" data-testid="plan-chart">
      <svg viewBox={`0 0 ${width} ${height}`} role="img" aria-label={label}>
        <line x1={left} x2={width - right} y1={y(0)} y2={y(0)} class="chart-axis" />
        <text x={left - 4} y={y(high) + 4} class="chart-key" text-anchor="end">
          {fig.money(high)}
        </text>
        <text x={left - 4} y={y(low) + 4} class="chart-key" text-anchor="end">
          {fig.money(low)}
        </text>
        {years.map((year, index) => {
          const x = centre(index);
          const spend = Math.abs(y(0) - y(year.cost));
          const save = Math.abs(y(0) - y(Math.max(0, year.savings)));
          return (
            <g key={year.year}>
              <rect x={x - bar - 1} y={y(0)} width={bar} height={Math.max(1, spend)} class="chart-now" rx={2} />
              <rect x={x + 1} y={y(0) - save} width={bar} height={Math.max(1, save)} class="chart-after" rx={2} />
              {(years.length <= 10 || index % 2 === 0) && (
                <text x={x} y={height - bottom + 14} class="chart-key" text-anchor="middle">
                  {year.year}
                </text>
              )}
            </g>
          );
        })}
        <polyline points={points} class="chart-line" />
        <g transform={`translate(${left}, ${height - 8})`}>
          <rect x={0} y={-8} width={10} height={10} class="chart-now" />
          <text x={14} y={1} class="chart-key">
            spent
          </text>
          <rect x={62} y={-8} width={10} height={10} class="chart-after" />
          <text x={76} y={1} class="chart-key">
            saved
          </text>
          <line x1={124} x2={140} y1={-3} y2={-3} class="chart-line" />
          <text x={144} y={1} class="chart-key">
            cumulative
          </text>
        </g>
      </svg>
      <figcaption class="visually-hidden">The plan year by year</figcaption>
    </figure>
  );
}
