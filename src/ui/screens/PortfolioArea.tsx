/**
 * The portfolio screens (the list, one portfolio with its roll-up, and its
 * phased plan), loaded when first visited. A portfolio's two screens share
 * one session, so moving between them keeps the figures and the autosave
 * queue.
 */
import { Screen } from '../components/Layout.tsx';
import type { Route } from '../router.ts';
import { useApp } from '../state/context.ts';
import { usePortfolioSession } from '../state/portfolioSession.ts';
import { PlanScreen } from './PlanScreen.tsx';
import { PortfolioScreen } from './PortfolioScreen.tsx';
import { PortfoliosScreen } from './PortfoliosScreen.tsx';

export type PortfolioRoute = Extract<Route, { name: 'portfolios' | 'portfolio' | 'plan' }>;

function OnePortfolio(props: { route: Extract<PortfolioRoute, { portfolioId: string }> }) {
  const { store } = useApp();
  const { route } = props;
  const { session, snapshot, error } = usePortfolioSession(store, route.portfolioId);
  if (error && !snapshot) {
    return (
      <Screen title="Portfolio not found" section="portfolios" back={{ route: { name: 'portfolios' }, label: 'Portfolios' }}>
        <p role="alert">{error}</p>
      </Screen>
    );
  }
  if (!session || !snapshot) {
    return (
      <Screen title="" section="portfolios">
        <p role="status">Opening the portfolio…</p>
      </Screen>
    );
  }
  if (route.name === 'plan') return <PlanScreen session={session} snapshot={snapshot} />;
  return <PortfolioScreen session={session} snapshot={snapshot} />;
}

/**
 * The portfolio screens by route.
 *
 * @example <PortfolioArea route={{ name: 'portfolios' }} /> //=> the list of portfolios and a way to start one
 */
export function PortfolioArea(props: { route: PortfolioRoute }) {
  const { route } = props;
  if (route.name === 'portfolios') return <PortfoliosScreen />;
  return <OnePortfolio route={route} />;
}
