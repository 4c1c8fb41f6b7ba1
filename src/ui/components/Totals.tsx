/** The headline figures of a survey: what the swap saves, costs and returns. */
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
