/**
 * Portfolios: groups of surveys (buildings, or unit layouts) planned
 * together — one landlord's estate, one contractor's multi-site job. The
 * list, and a short form to start a new one.
 */
import { useEffect, useState } from 'preact/hooks';
import type { Portfolio } from '../../survey/model.ts';
import { TextField } from '../components/fields.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { Section } from '../components/Section.tsx';
import { go, href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';

/** Plan settings of a new portfolio: no budget yet, over three years (common practice, no published source). */
const newPlan = { budgetPerYear: 0, years: 3 } as const;

function PortfolioCard(props: { portfolio: Portfolio }) {
  const { portfolio } = props;
  const count = portfolio.surveyIds.length;
  return (
    <li>
      <a class="card card--link" href={href({ name: 'portfolio', portfolioId: portfolio.id })} data-testid="portfolio-card">
        <span class="card-title">{portfolio.name || 'Untitled portfolio'}</span>
        {portfolio.client.name && <span class="card-line">For {portfolio.client.name}</span>}
        <span class="card-line quiet">
          {count} {count === 1 ? 'survey' : 'surveys'}
        </span>
        <Icon name="next" />
      </a>
    </li>
  );
}

/**
 * The portfolios list with a form to start one.
 *
 * @example <PortfoliosScreen /> //=> the portfolios on this device and "Start a portfolio"
 */
export function PortfoliosScreen() {
  const { store, notify } = useApp();
  const [portfolios, setPortfolios] = useState<Portfolio[] | null>(null);
  const [name, setName] = useState('');
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);

  useEffect(() => {
    store.listPortfolios().then(setPortfolios, (error: unknown) => notify({ tone: 'error', text: messageOf(error) }));
  }, [store]);

  const create = async (event: Event) => {
    event.preventDefault();
    if (name.trim() === '') {
      setMessage('Give the portfolio a name, e.g. the estate or the job.');
      return;
    }
    setBusy(true);
    try {
      const created = await store.createPortfolio({ name: name.trim(), client: { name: '', contact: '' }, surveyIds: [], plan: { ...newPlan }, notes: '' });
      go({ name: 'portfolio', portfolioId: created.id });
    } catch (error) {
      setMessage(messageOf(error));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Screen title="Portfolios" section="portfolios" back={{ route: { name: 'surveys' }, label: 'Surveys' }}>
      <p class="quiet">
        Group the surveys of several buildings (or of unit layouts) to see their totals side by side and plan the work year by year under a budget.
      </p>
      <Section title="Start a portfolio">
        <form class="inline-form" onSubmit={create}>
          <TextField
            label="Portfolio name"
            value={name}
            onChange={(value) => {
              setName(value);
              setMessage(null);
            }}
            maxLength={200}
            testId="new-portfolio-name"
          />
          <button type="submit" class="button button--primary" disabled={busy} data-testid="new-portfolio">
            <Icon name="plus" />
            Start a portfolio
          </button>
        </form>
        {message && (
          <p class="field-message" role="alert">
            {message}
          </p>
        )}
      </Section>
      <Section title="On this device">
        {portfolios === null && <p class="quiet">Opening…</p>}
        {portfolios?.length === 0 && <p>No portfolios yet. Start one above, then choose its surveys.</p>}
        {portfolios && portfolios.length > 0 && (
          <ul class="cards">
            {portfolios.map((portfolio) => (
              <PortfolioCard key={portfolio.id} portfolio={portfolio} />
            ))}
          </ul>
        )}
      </Section>
    </Screen>
  );
}
