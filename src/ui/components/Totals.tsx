/** The headline figures of a survey: what the swap saves, costs and returns. */
import type { LayoutResult } from '../../calc/portfolio.ts';
import type { SurveyResult } from '../../calc/survey.ts';
import type { Survey } from '../../survey/model.ts';
import type { UiFigures } from '../state/format.ts';
import { totalsText } from '../state/totals.ts';
import { Icon, type IconName } from './Icon.tsx';

function Figure(props: { label: string; value: string; icon?: IconName; testId: string; note?: string | undefined }) {
  return (
    <div class="figure">
      <dt>
        {props.icon && <Icon name={props.icon} size={18} />}
        {props.label}
      </dt>
      <dd data-testid={props.testId}>{props.value}</dd>
      {props.note && <dd class="figure-note">{props.note}</dd>}
    </div>
  );
}

/**
 * The headline figures of a survey.
 *
 * @example <Totals survey={survey} result={result} fig={fig} /> //=> eight figures from kWh/yr to CO2
 */
export function Totals(props: { survey: Survey; result: SurveyResult; fig: UiFigures }) {
  const { survey, result, fig } = props;
  const text = totalsText(survey, result, fig);
  const irr = result.economics.internalRateOfReturn;
  const irrNote = irr.kind === 'multiple' ? 'Cash flows change sign more than once: judge by NPV.' : irr.kind === 'none' ? irr.reason : undefined;
  const t = result.totals;
  return (
    <dl class="figures" data-testid="totals">
      <Figure label="Energy saved" value={text['total-kwh']!} icon="bolt" testId="total-kwh" />
      <Figure label="Peak demand saved" value={text['total-kw']!} testId="total-kw" />
      <Figure label="Money saved" value={text['total-money']!} testId="total-money" />
      <Figure label="Project cost, net of rebates" value={text['total-cost']!} testId="total-cost" note={t.money.cost.rebates > 0 ? `after ${fig.money(t.money.cost.rebates)} rebates` : undefined} />
      <Figure label="Simple payback" value={text['total-payback']!} testId="total-payback" />
      <Figure label={`NPV over ${survey.money.analysisYears} years`} value={text['total-npv']!} testId="total-npv" />
      <Figure label="IRR" value={text['total-irr']!} testId="total-irr" {...(irrNote ? { note: irrNote } : {})} />
      <Figure label="CO2 avoided" value={text['total-co2']!} testId="total-co2" />
    </dl>
  );
}

/**
 * A survey's result with the totals and economics of every unit of its
 * layout (room and entry figures stay those of the surveyed unit), so the
 * headline figures and the cash-flow chart speak for all units.
 *
 * @example allUnitsResult(result, calculateLayout(survey, result)).totals.fixtures //=> fixtures across all units
 */
export function allUnitsResult(result: SurveyResult, layout: LayoutResult): SurveyResult {
  return { ...result, totals: layout.totals, economics: layout.economics };
}

/**
 * Per unit beside all units, for a survey that stands for several units.
 *
 * @example <UnitTotals survey={survey} layout={calculateLayout(survey, result)} fig={fig} /> //=> a table: fixtures, kWh, kW, money, cost, payback, NPV, CO2 per unit and for all units
 */
export function UnitTotals(props: { survey: Survey; layout: LayoutResult; fig: UiFigures }) {
  const { layout, fig } = props;
  const one = layout.perUnit;
  const all = layout.totals;
  const unitNpv = layout.unitResult.economics.netPresentValue;
  const rows: { id: string; label: string; perUnit: string; allUnits: string }[] = [
    { id: 'fixtures', label: 'Fixtures', perUnit: fig.number(one.fixtures), allUnits: fig.number(all.fixtures) },
    { id: 'kwh', label: 'Energy saved', perUnit: fig.kwhPerYear(one.savings.kwhPerYear), allUnits: fig.kwhPerYear(all.savings.kwhPerYear) },
    { id: 'kw', label: 'Peak demand saved', perUnit: fig.kw(one.savings.peakKw), allUnits: fig.kw(all.savings.peakKw) },
    { id: 'money', label: 'Money saved', perUnit: `${fig.money(one.money.totalPerYear)}/yr`, allUnits: `${fig.money(all.money.totalPerYear)}/yr` },
    { id: 'cost', label: 'Project cost, net', perUnit: fig.money(one.money.cost.net), allUnits: fig.money(all.money.cost.net) },
    { id: 'payback', label: 'Simple payback', perUnit: fig.payback(one.money.simplePaybackYears), allUnits: fig.payback(all.money.simplePaybackYears) },
    { id: 'npv', label: `NPV over ${props.survey.money.analysisYears} years`, perUnit: fig.money(unitNpv), allUnits: fig.money(layout.economics.netPresentValue) },
    { id: 'co2', label: 'CO2 avoided', perUnit: fig.co2PerYear(one.co2KgPerYear), allUnits: fig.co2PerYear(all.co2KgPerYear) },
  ];
  const differing = layout.differingUnits;
  return (
    <div class="table-wrap" data-testid="unit-totals">
      <table>
        <caption>
          The surveyed unit and all {fig.number(layout.units)} units
          {differing > 0 ? ` (${differing} ${differing === 1 ? 'differs' : 'differ'} from the surveyed unit)` : ''}
        </caption>
        <thead>
          <tr>
            <th scope="col">Figure</th>
            <th scope="col">Per unit</th>
            <th scope="col">All {fig.number(layout.units)} units</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.id}>
              <th scope="row">{row.label}</th>
              <td data-testid={`unit-${row.id}`}>{row.perUnit}</td>
              <td data-testid={`all-${row.id}`}>{row.allUnits}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
