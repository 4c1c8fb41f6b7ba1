/**
 * First screen: the demo survey's headline figures and warnings, straight
 * from the calculation engine. The field screens replace this.
 */
import { calculateSurvey, type SurveyResult } from '../calc/survey.ts';
import { formatMoney, formatNumber, luxToFootcandles } from '../calc/units.ts';
import type { Warning } from '../calc/warnings.ts';
import { demoSurvey } from '../survey/demo.ts';

function describeIrr(result: SurveyResult): string {
  const irr = result.economics.internalRateOfReturn;
  if (irr.kind === 'unique') return `${formatNumber(irr.ratePerYear * 100, 'en-US', 1)} %`;
  if (irr.kind === 'multiple') return 'several rates (see report)';
  return 'none';
}

function Figure(props: { label: string; value: string }) {
  return (
    <div class="figure">
      <dt>{props.label}</dt>
      <dd>{props.value}</dd>
    </div>
  );
}

function WarningItem(props: { warning: Warning }) {
  const w = props.warning;
  return (
    <li class={`warning warning--${w.severity}`}>
      <strong>
        <span class="severity">{w.severity}</span> {w.title}
      </strong>
      <p>{w.message}</p>
      <p class="action">{w.action}</p>
    </li>
  );
}

export function App() {
  const survey = demoSurvey();
  const result = calculateSurvey(survey);
  const { locale } = survey;
  const money = (n: number) => formatMoney(n, result.currency, locale, 0);
  const t = result.totals;
  const payback = t.money.simplePaybackYears;
  return (
    <main>
      <header class="masthead">
        <h1>Lampwalk</h1>
        <p>{survey.name}</p>
      </header>
      <section aria-labelledby="totals-heading">
        <h2 id="totals-heading">What the swap does</h2>
        <dl class="figures">
          <Figure label="Energy saved" value={`${formatNumber(t.savings.kwhPerYear, locale)} kWh/yr`} />
          <Figure label="Demand saved (peak)" value={`${formatNumber(t.savings.peakKw, locale, 2)} kW`} />
          <Figure label="Money saved" value={`${money(t.money.totalPerYear)}/yr`} />
          <Figure label="Project cost, net of rebates" value={money(t.money.cost.net)} />
          <Figure label="Simple payback" value={payback === null ? 'never' : `${formatNumber(payback, locale, 1)} years`} />
          <Figure label={`NPV over ${survey.money.analysisYears} years`} value={money(result.economics.netPresentValue)} />
          <Figure label="IRR" value={describeIrr(result)} />
          <Figure label="CO2 avoided" value={`${formatNumber(t.co2KgPerYear / 1000, locale, 2)} t/yr`} />
        </dl>
      </section>
      <section aria-labelledby="rooms-heading">
        <h2 id="rooms-heading">Rooms</h2>
        <table>
          <thead>
            <tr>
              <th scope="col">Room</th>
              <th scope="col">kWh/yr saved</th>
              <th scope="col">Light now → after (fc)</th>
              <th scope="col">Target (fc)</th>
            </tr>
          </thead>
          <tbody>
            {result.rooms.map((r) => (
              <tr key={r.roomId}>
                <th scope="row">{r.name}</th>
                <td>{formatNumber(r.savings.kwhPerYear, locale)}</td>
                <td>
                  {r.adequacy.existingLux === null ? '—' : formatNumber(luxToFootcandles(r.adequacy.existingLux), locale)} →{' '}
                  {r.adequacy.proposedLux === null ? '—' : formatNumber(luxToFootcandles(r.adequacy.proposedLux), locale)}
                </td>
                <td>{formatNumber(r.adequacy.targetFootcandles, locale)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section aria-labelledby="warnings-heading">
        <h2 id="warnings-heading">Fix before ordering ({result.warnings.length})</h2>
        <ul class="warnings">
          {result.warnings.map((w, i) => (
            <WarningItem key={`${w.code}-${w.entryId ?? w.roomId ?? i}`} warning={w} />
          ))}
        </ul>
      </section>
      <footer>
        <p>
          Estimates, not guarantees. Wiring work must follow local codes and be done by a licensed electrician.
        </p>
      </footer>
    </main>
  );
}
