/**
 * One portfolio: its name and client, which surveys it groups, the roll-up
 * of all their units, and the sites side by side (savings, cost, payback,
 * NPV, CO2, warnings), each linking to its survey. Surveys in different
 * currencies cannot be added up: the screen says so and still compares the
 * sites, each in its own currency.
 */
import { useMemo } from 'preact/hooks';
import { calculatePortfolio, type PortfolioResult, type SiteSummary } from '../../calc/portfolio.ts';
import type { Survey, SurveyHeader } from '../../survey/model.ts';
import { TextField } from '../components/fields.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { SaveStatus } from '../components/SaveStatus.tsx';
import { Section } from '../components/Section.tsx';
import { WarningBadges } from '../components/Warnings.tsx';
import { go, href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import type { UiFigures } from '../state/format.ts';
import type { PortfolioSession, PortfolioSnapshot } from '../state/portfolioSession.ts';
import { portfolioFigures, portfolioTotalsText, siteColumns, siteRowText } from '../state/portfolioText.ts';

/** What the roll-up could be worked out as. */
export type RollUp =
  | { kind: 'loading' }
  | { kind: 'empty' }
  | { kind: 'ready'; result: PortfolioResult; surveys: Survey[] }
  /** Sites in more than one currency: compared one by one, never added up. */
  | { kind: 'mixed'; currencies: { currency: string; names: string[] }[]; sites: { site: SiteSummary; currency: string }[]; problems: string[] }
  | { kind: 'failed'; message: string };

/**
 * The portfolio's surveys in its order, or null while some are still being read.
 *
 * @example surveysInOrder(snapshot)?.map((s) => s.id) //=> snapshot.portfolio.surveyIds without those missing
 */
export function surveysInOrder(snapshot: PortfolioSnapshot): Survey[] | null {
  const list: Survey[] = [];
  for (const id of snapshot.portfolio.surveyIds) {
    if (snapshot.missing.includes(id)) continue;
    const survey = snapshot.surveys.get(id);
    if (!survey) return null;
    list.push(survey);
  }
  return list;
}

/**
 * Works out the roll-up of a portfolio (see {@link RollUp}).
 *
 * @example rollUp(snapshot).kind //=> 'ready' when every survey is read and uses one currency
 */
export function rollUp(snapshot: PortfolioSnapshot): RollUp {
  const surveys = surveysInOrder(snapshot);
  if (!surveys) return { kind: 'loading' };
  if (surveys.length === 0) return { kind: 'empty' };
  const portfolio = { ...snapshot.portfolio, surveyIds: surveys.map((survey) => survey.id) };
  const byCurrency = new Map<string, string[]>();
  for (const survey of surveys) byCurrency.set(survey.money.currency, [...(byCurrency.get(survey.money.currency) ?? []), survey.name || 'Untitled survey']);
  if (byCurrency.size > 1) {
    const sites: { site: SiteSummary; currency: string }[] = [];
    const problems: string[] = [];
    for (const survey of surveys) {
      try {
        const [site] = calculatePortfolio({ ...portfolio, surveyIds: [survey.id] }, [survey]).sites;
        if (site) sites.push({ site, currency: survey.money.currency });
      } catch (error) {
        problems.push(`${survey.name || 'Untitled survey'}: ${messageOf(error)}`);
      }
    }
    return { kind: 'mixed', currencies: [...byCurrency].map(([currency, names]) => ({ currency, names })), sites, problems };
  }
  try {
    return { kind: 'ready', result: calculatePortfolio(portfolio, surveys), surveys };
  } catch (error) {
    const message = messageOf(error).replace(/surveyIds\[(\d+)\]/, (_, index: string) => `“${surveys[Number(index)]?.name ?? `survey ${Number(index) + 1}`}”`);
    return { kind: 'failed', message };
  }
}

function RollUpFigures(props: { result: PortfolioResult; fig: UiFigures }) {
  const text = portfolioTotalsText(props.result, props.fig);
  const e = props.result.economics;
  const rates = e.discountRatesPerYear;
  const items: { id: string; label: string; note?: string }[] = [
    { id: 'pf-units', label: 'Units' },
    { id: 'pf-fixtures', label: 'Fixtures' },
    { id: 'pf-kwh', label: 'Energy saved' },
    { id: 'pf-kw', label: 'Load removed' },
    { id: 'pf-money', label: 'Money saved' },
    { id: 'pf-cost', label: 'Cost, net of rebates' },
    { id: 'pf-payback', label: 'Simple payback' },
    {
      id: 'pf-npv',
      label: 'NPV',
      note: rates.length > 1 ? 'Each site at its own discount rate and period; present values add.' : `Over up to ${e.analysisYears} years.`,
    },
    { id: 'pf-co2', label: 'CO2 avoided' },
    { id: 'pf-warnings', label: 'Warnings (surveyed units)' },
  ];
  return (
    <dl class="figures" data-testid="portfolio-totals">
      {items.map((item) => (
        <div class="figure" key={item.id}>
          <dt>{item.label}</dt>
          <dd data-testid={item.id}>{text[item.id]}</dd>
          {item.note && <dd class="figure-note">{item.note}</dd>}
        </div>
      ))}
    </dl>
  );
}

function SiteTable(props: { rows: { site: SiteSummary; fig: UiFigures }[]; caption: string }) {
  return (
    <div class="table-wrap" role="region" aria-label={props.caption} tabIndex={0} data-testid="site-table">
      <table class="site-table">
        <caption class="visually-hidden">{props.caption}</caption>
        <thead>
          <tr>
            <th scope="col">Site</th>
            {siteColumns.map((column) => (
              <th scope="col" key={column.id}>
                {column.heading}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {props.rows.map(({ site, fig }) => {
            const text = siteRowText(site, fig);
            return (
              <tr key={site.surveyId} data-testid="site-row" data-survey={site.surveyId}>
                <th scope="row">
                  <a href={href({ name: 'survey', surveyId: site.surveyId })}>{site.name || 'Untitled survey'}</a>
                </th>
                {siteColumns.map((column) => (
                  <td key={column.id} data-testid={`site-${column.id}`}>
                    {column.id === 'warnings' ? (
                      <>
                        <WarningBadges counts={site.warningCounts} />
                        <span class={site.warningCounts.danger + site.warningCounts.caution + site.warningCounts.advice > 0 ? 'visually-hidden' : ''}>{text.warnings}</span>
                      </>
                    ) : (
                      text[column.id]
                    )}
                  </td>
                ))}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

function SurveyChooser(props: { session: PortfolioSession; headers: readonly SurveyHeader[]; chosen: readonly string[] }) {
  const { session, headers, chosen } = props;
  const toggle = (id: string, on: boolean) => {
    const next = on ? [...chosen.filter((item) => item !== id), id] : chosen.filter((item) => item !== id);
    return session.update({ surveyIds: next });
  };
  if (headers.length === 0) {
    return (
      <p>
        No surveys on this device yet. <a href={href({ name: 'surveys' })}>Start one</a>, then come back.
      </p>
    );
  }
  return (
    <fieldset class="survey-chooser" data-testid="survey-chooser">
      <legend>Surveys in this portfolio</legend>
      <ul class="plain-list">
        {headers.map((header) => {
          const id = `choose-${header.id}`;
          const place = [header.site.name, header.site.address].filter(Boolean).join(', ');
          return (
            <li key={header.id} class="check-row">
              <input id={id} type="checkbox" checked={chosen.includes(header.id)} onChange={(event) => toggle(header.id, (event.currentTarget as HTMLInputElement).checked)} data-testid="choose-survey" data-survey={header.id} />
              <label for={id}>
                <span class="check-title">{header.name || 'Untitled survey'}</span>
                {place && <span class="quiet"> · {place}</span>}
                {header.layout && <span class="quiet"> · {header.layout.unitCount} units</span>}
                <span class="quiet"> · {header.money.currency}</span>
              </label>
            </li>
          );
        })}
      </ul>
    </fieldset>
  );
}

function DeletePortfolio(props: { session: PortfolioSession }) {
  const { store, notify } = useApp();
  const remove = async () => {
    try {
      await props.session.flush();
      const { portfolio } = props.session.snapshot;
      const trashId = await store.deletePortfolio(portfolio.id);
      go({ name: 'portfolios' });
      notify({
        tone: 'info',
        text: `“${portfolio.name || 'Untitled portfolio'}” moved to Recently deleted (its surveys are kept).`,
        action: {
          label: 'Undo',
          run: async () => {
            await store.restoreFromTrash(trashId);
            go({ name: 'portfolio', portfolioId: portfolio.id });
          },
        },
      });
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    }
  };
  return (
    <button type="button" class="button button--danger" onClick={remove} data-testid="delete-portfolio">
      <Icon name="trash" />
      Delete this portfolio
    </button>
  );
}

/**
 * A portfolio: details, surveys, roll-up and comparison.
 *
 * @example <PortfolioScreen session={session} snapshot={snapshot} /> //=> the roll-up figures and the sites side by side
 */
export function PortfolioScreen(props: { session: PortfolioSession; snapshot: PortfolioSnapshot }) {
  const { preferences } = useApp();
  const { session, snapshot } = props;
  const { portfolio } = snapshot;
  const rolled = useMemo(() => rollUp(snapshot), [snapshot.portfolio.surveyIds, snapshot.surveys, snapshot.missing]);
  const figFor = (currency: string) => portfolioFigures(preferences.locale, preferences.units, currency);

  return (
    <Screen
      title={portfolio.name || 'Untitled portfolio'}
      section="portfolios"
      back={{ route: { name: 'portfolios' }, label: 'Portfolios' }}
      subtitle={portfolio.client.name ? `for ${portfolio.client.name}` : undefined}
      aside={<SaveStatus status={snapshot.status} />}
    >
      {snapshot.missing.length > 0 && (
        <div class="panel panel--alert" role="alert" data-testid="portfolio-missing">
          <p>
            {snapshot.missing.length} {snapshot.missing.length === 1 ? 'survey of this portfolio is' : 'surveys of this portfolio are'} not on this device
            (deleted, or not restored from a backup). The figures leave {snapshot.missing.length === 1 ? 'it' : 'them'} out.
          </p>
          <button type="button" class="button" onClick={() => session.update({ surveyIds: portfolio.surveyIds.filter((id) => !snapshot.missing.includes(id)) })}>
            Take {snapshot.missing.length === 1 ? 'it' : 'them'} out of the portfolio
          </button>
        </div>
      )}
      <div class="overview">
        <div class="overview-main">
          <Section title="All sites together">
            {rolled.kind === 'loading' && <p role="status">Reading the surveys…</p>}
            {rolled.kind === 'empty' && <p>Choose the surveys of this portfolio below; their totals and a comparison appear here.</p>}
            {rolled.kind === 'failed' && (
              <p class="panel panel--alert" role="alert">
                The figures cannot be worked out: {rolled.message}
              </p>
            )}
            {rolled.kind === 'mixed' && (
              <div class="panel panel--alert" role="alert" data-testid="mixed-currencies">
                <p>
                  <strong>These surveys use different currencies, so their money cannot be added up.</strong> Each site is shown in its own currency
                  below. To see totals and plan under one budget, give every survey the same currency (under Assumptions) or take the others out.
                </p>
                <ul>
                  {rolled.currencies.map((group) => (
                    <li key={group.currency}>
                      {group.currency}: {group.names.join(', ')}
                    </li>
                  ))}
                </ul>
              </div>
            )}
            {rolled.kind === 'ready' && rolled.result.currency && <RollUpFigures result={rolled.result} fig={figFor(rolled.result.currency)} />}
          </Section>
          {(rolled.kind === 'ready' || rolled.kind === 'mixed') && (
            <Section title="Sites side by side">
              <SiteTable
                caption="Each site across all its units"
                rows={
                  rolled.kind === 'ready'
                    ? rolled.result.sites.map((site) => ({ site, fig: figFor(rolled.result.currency ?? 'USD') }))
                    : rolled.sites.map(({ site, currency }) => ({ site, fig: figFor(currency) }))
                }
              />
              {rolled.kind === 'mixed' && rolled.problems.map((problem) => <p class="problems" key={problem}>{problem}</p>)}
              <p class="quiet">Figures are for all units of each site; warnings are those of the surveyed unit. Tap a site to open its survey.</p>
            </Section>
          )}
        </div>
        <div class="overview-side">
          <Section title="Plan the work">
            <p class="quiet">Spread the swap over several years under a yearly budget: which measures to do first, what each year costs and saves.</p>
            <a class="button button--primary" href={href({ name: 'plan', portfolioId: portfolio.id })} data-testid="open-plan">
              <Icon name="list" />
              Phased plan
            </a>
          </Section>
          <Section title="Surveys">
            <SurveyChooser session={session} headers={snapshot.headers} chosen={portfolio.surveyIds} />
          </Section>
        </div>
      </div>
      <details class="panel" open={portfolio.surveyIds.length === 0}>
        <summary>
          <h2>Name and client</h2>
        </summary>
        <div class="grid-fields">
          <TextField label="Portfolio name" value={portfolio.name} onChange={(name) => session.update({ name })} testId="portfolio-name" />
          <TextField label="Client" value={portfolio.client.name} onChange={(name) => session.update({ client: { ...portfolio.client, name } })} testId="portfolio-client" />
          <TextField label="Client contact" value={portfolio.client.contact} onChange={(contact) => session.update({ client: { ...portfolio.client, contact } })} />
          <TextField label="Notes" value={portfolio.notes} onChange={(notes) => session.update({ notes })} multiline class="field--wide" />
        </div>
      </details>
      <div class="danger-zone">
        <DeletePortfolio session={session} />
      </div>
    </Screen>
  );
}
