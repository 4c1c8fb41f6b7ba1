/**
 * The phased plan of a portfolio: with a yearly budget and a number of
 * years, which measures (fixture entries to swap, all units of a layout at
 * once) to do in which year; each year's cost, budget left, savings and
 * cumulative cash flow; why each measure that waits (or is left out) waited;
 * how the plan was found and how close it is to the best possible. The plan
 * is worked out a moment after the budget stops changing, so typing stays
 * quick.
 */
import { useEffect, useMemo, useState } from 'preact/hooks';
import { maxPlanYears, measuresFromSurveys, planPhases, type Measure, type PhasePlan } from '../../calc/phasing.ts';
import { NumberField } from '../components/fields.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { PlanChart } from '../components/PlanChart.tsx';
import { PlanExports } from '../components/PlanExports.tsx';
import { SaveStatus } from '../components/SaveStatus.tsx';
import { Section } from '../components/Section.tsx';
import { href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { rules } from '../state/fields.ts';
import type { UiFigures } from '../state/format.ts';
import type { PortfolioSession, PortfolioSnapshot } from '../state/portfolioSession.ts';
import { portfolioFigures } from '../state/portfolioText.ts';
import { surveysInOrder } from './PortfolioScreen.tsx';

/** Wait after the last change of the budget or years before planning again (common practice, no published source). */
const settleMs = 250;

type Planning =
  | { kind: 'waiting'; text: string }
  | { kind: 'working' }
  | { kind: 'ready'; plan: PhasePlan; measures: Measure[]; currency: string }
  | { kind: 'failed'; message: string };

/**
 * How the plan was found, in one line.
 *
 * @example methodText(plan, fig) //=> 'Optimal: no plan within these budgets has a larger NPV (exact search, 1,204 steps).'
 */
export function methodText(plan: PhasePlan, fig: UiFigures): string {
  if (plan.optimal) return `Optimal: no plan within these budgets has a larger NPV (exact search, ${fig.number(plan.nodes)} steps).`;
  const how = plan.method === 'exact' ? 'the exact search, stopped at its step limit' : 'a quick search (greedy, then improved move by move)';
  return `Within ${fig.percent(plan.gapFraction)} of the best possible (no plan can reach more than ${fig.money(plan.upperBound)} NPV); found by ${how}.`;
}

function YearTable(props: { plan: PhasePlan; fig: UiFigures }) {
  const { plan, fig } = props;
  return (
    <div class="table-wrap" role="region" aria-label="The plan year by year" tabIndex={0}>
      <table data-testid="plan-years">
        <caption class="visually-hidden">The plan year by year</caption>
        <thead>
          <tr>
            <th scope="col">Year</th>
            <th scope="col">Measures</th>
            <th scope="col">Cost</th>
            <th scope="col">Budget left</th>
            <th scope="col">Savings a year so far</th>
            <th scope="col">Cash flow</th>
            <th scope="col">Cumulative</th>
          </tr>
        </thead>
        <tbody>
          {plan.years.map((year) => (
            <tr key={year.year} data-testid="plan-year">
              <th scope="row">{year.year}</th>
              <td>{fig.number(year.measures.length)}</td>
              <td data-testid="plan-year-cost">{fig.money(year.cost)}</td>
              <td>{fig.money(year.budgetLeft)}</td>
              <td>{fig.money(year.savingsPerYear)}</td>
              <td>{fig.money(year.cashFlow)}</td>
              <td data-testid="plan-year-cumulative">{fig.money(year.cumulativeCashFlow)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function MeasuresByYear(props: { plan: PhasePlan; measures: readonly Measure[]; fig: UiFigures }) {
  const { plan, fig } = props;
  const byId = new Map(props.measures.map((measure) => [measure.id, measure]));
  return (
    <ol class="plain-list plan-years">
      {plan.years.map((year) => (
        <li key={year.year} class="subpanel">
          <h3>
            Year {year.year}: {year.measures.length === 0 ? 'nothing' : `${year.measures.length} ${year.measures.length === 1 ? 'measure' : 'measures'}, ${fig.money(year.cost)}`}
          </h3>
          {year.measures.length > 0 && (
            <ul class="plain-list" data-testid="plan-year-measures">
              {year.measures.map((id) => {
                const measure = byId.get(id);
                return (
                  <li key={id} class="plan-measure">
                    <span>{measure ? <a href={href({ name: 'entry', surveyId: measure.surveyId, roomId: measure.roomId, entryId: measure.entryId })}>{measure.label}</a> : id}</span>
                    {measure && (
                      <span class="quiet">
                        {' '}
                        · {fig.number(measure.fixtures)} fixtures{measure.productName ? ` → ${measure.productName}` : ''} · {fig.money(measure.cost)} · saves {fig.money(measure.savingsPerYear)}/yr
                      </span>
                    )}
                  </li>
                );
              })}
            </ul>
          )}
        </li>
      ))}
    </ol>
  );
}

function Deferred(props: { plan: PhasePlan }) {
  const { deferred } = props.plan;
  if (deferred.length === 0) return <p data-testid="plan-no-deferred">Every measure is done in year 1.</p>;
  return (
    <ul class="plain-list deferred-list" data-testid="plan-deferred">
      {deferred.map((item) => (
        <li key={item.measureId} class="deferred" data-testid="deferred" data-kind={item.kind}>
          <span class={`tag ${item.year === null ? 'tag--caution' : 'tag--advice'}`}>{item.year === null ? 'not done' : `year ${item.year}`}</span> <strong>{item.label}</strong>
          <span class="deferred-reason">: {item.reason}</span>
        </li>
      ))}
    </ul>
  );
}

/**
 * The phased plan screen.
 *
 * @example <PlanScreen session={session} snapshot={snapshot} /> //=> budget and years, the plan year by year, what waited and why, exports
 */
export function PlanScreen(props: { session: PortfolioSession; snapshot: PortfolioSnapshot }) {
  const { preferences } = useApp();
  const { session, snapshot } = props;
  const { portfolio } = snapshot;
  const settings = portfolio.plan;
  const surveys = useMemo(() => surveysInOrder(snapshot), [snapshot.portfolio.surveyIds, snapshot.surveys, snapshot.missing]);
  const currency = surveys?.[0]?.money.currency ?? preferences.currency;
  const fig = portfolioFigures(preferences.locale, preferences.units, currency);
  const [planning, setPlanning] = useState<Planning>({ kind: 'working' });

  useEffect(() => {
    if (!surveys) {
      setPlanning({ kind: 'waiting', text: 'Reading the surveys…' });
      return;
    }
    if (surveys.length === 0) {
      setPlanning({ kind: 'waiting', text: 'This portfolio has no surveys yet: choose them on the portfolio screen.' });
      return;
    }
    const currencies = [...new Set(surveys.map((survey) => survey.money.currency))];
    if (currencies.length > 1) {
      setPlanning({
        kind: 'failed',
        message: `The surveys use different currencies (${currencies.join(', ')}), so one budget cannot cover them. Give every survey the same currency, or take the others out of the portfolio.`,
      });
      return;
    }
    setPlanning({ kind: 'working' });
    const timer = window.setTimeout(() => {
      try {
        const measures = measuresFromSurveys(surveys);
        const plan = planPhases(measures, settings, { locale: preferences.locale, currency });
        setPlanning({ kind: 'ready', plan, measures, currency });
      } catch (error) {
        setPlanning({ kind: 'failed', message: messageOf(error).replace(/surveys\[(\d+)\]/, (_, index: string) => `“${surveys[Number(index)]?.name ?? 'a survey'}”`) });
      }
    }, settleMs);
    return () => window.clearTimeout(timer);
  }, [surveys, settings.budgetPerYear, settings.years, preferences.locale]);

  const plan = planning.kind === 'ready' ? planning.plan : null;

  return (
    <Screen
      title={`Phased plan: ${portfolio.name || 'Untitled portfolio'}`}
      section="portfolios"
      back={{ route: { name: 'portfolio', portfolioId: portfolio.id }, label: portfolio.name || 'Portfolio' }}
      aside={<SaveStatus status={snapshot.status} />}
    >
      <Section title="Budget">
        <div class="grid-fields">
          <NumberField
            label="Budget per year"
            value={settings.budgetPerYear}
            rule={rules.money}
            locale={preferences.locale}
            unit={currency}
            onChange={(value) => (value === undefined ? 'Enter the money available each year (0 or more).' : session.update({ plan: { ...settings, budgetPerYear: value } }))}
            hint="Net of rebates. Budget not spent in a year is not carried over."
            testId="plan-budget"
          />
          <NumberField
            label="Years"
            value={settings.years}
            rule={{ min: 1, max: maxPlanYears, integer: true }}
            locale={preferences.locale}
            onChange={(value) => (value === undefined ? `Enter the years to spread the work over (1 to ${maxPlanYears}).` : session.update({ plan: { ...settings, years: value } }))}
            hint={`Whole years, 1 to ${maxPlanYears}, this year included.`}
            testId="plan-years-count"
          />
        </div>
        {settings.budgetPerYear === 0 && <p class="nudge"><Icon name="rethink" size={20} /><span>No budget yet: only measures that cost nothing after rebates can be planned.</span></p>}
      </Section>

      <div aria-live="polite" data-testid="plan-status">
        {planning.kind === 'waiting' && <p role="status">{planning.text}</p>}
        {planning.kind === 'working' && <p role="status">Working out the plan…</p>}
        {planning.kind === 'failed' && (
          <p class="panel panel--alert" role="alert" data-testid="plan-error">
            {planning.message}
          </p>
        )}
      </div>

      {plan && planning.kind === 'ready' && (
        <>
          <Section title="The plan">
            <dl class="figures">
              <div class="figure">
                <dt>Measures planned</dt>
                <dd data-testid="plan-count">
                  {fig.number(plan.measures.filter((measure) => measure.year !== null).length)} of {fig.number(plan.measures.length)}
                </dd>
              </div>
              <div class="figure">
                <dt>Spent over {fig.number(settings.years)} years</dt>
                <dd data-testid="plan-spent">{fig.money(plan.years.reduce((sum, year) => sum + year.cost, 0))}</dd>
              </div>
              <div class="figure">
                <dt>NPV of the plan</dt>
                <dd data-testid="plan-npv">{fig.money(plan.npv)}</dd>
              </div>
            </dl>
            <p data-testid="plan-method" class={plan.optimal ? '' : 'nudge'}>
              {methodText(plan, fig)}
            </p>
            <PlanChart years={plan.years} fig={fig} />
            <YearTable plan={plan} fig={fig} />
          </Section>
          <Section title="What is done each year">
            <MeasuresByYear plan={plan} measures={planning.measures} fig={fig} />
          </Section>
          <Section title="What waits, and why">
            <Deferred plan={plan} />
          </Section>
          <details class="panel">
            <summary>
              <h2>How the plan is worked out</h2>
            </summary>
            <ul>
              {plan.conventions.map((line) => (
                <li key={line}>{line}</li>
              ))}
            </ul>
          </details>
        </>
      )}
      <Section title="Documents">
        <PlanExports session={session} snapshot={snapshot} plan={plan} measures={planning.kind === 'ready' ? planning.measures : null} />
      </Section>
    </Screen>
  );
}
