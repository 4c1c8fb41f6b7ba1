/**
 * A small hash router: every screen has an address (`#/s/<survey>/r/<room>`),
 * so the back button, reloads and bookmarks work offline with no server help.
 */
import { useEffect, useState } from 'preact/hooks';

export type Route =
  | { name: 'surveys' }
  | { name: 'survey'; surveyId: string }
  | { name: 'room'; surveyId: string; roomId: string }
  | { name: 'entry'; surveyId: string; roomId: string; entryId: string }
  | { name: 'suggest'; surveyId: string }
  | { name: 'portfolios' }
  | { name: 'portfolio'; portfolioId: string }
  | { name: 'plan'; portfolioId: string }
  | { name: 'catalog' }
  | { name: 'product'; productId: string }
  | { name: 'settings' }
  | { name: 'missing'; hash: string };

function decode(part: string): string | null {
  try {
    const value = decodeURIComponent(part);
    return value === '' ? null : value;
  } catch {
    return null;
  }
}

/**
 * The route for a location hash.
 *
 * @example parseRoute('#/s/demo/r/shop') //=> { name: 'room', surveyId: 'demo', roomId: 'shop' }
 */
export function parseRoute(hash: string): Route {
  const path = hash.replace(/^#\/?/, '');
  if (path === '') return { name: 'surveys' };
  const parts = path.split('/').map(decode);
  if (parts.some((part) => part === null)) return { name: 'missing', hash };
  const [a, b, c, d, e, f] = parts as string[];
  if (a === 'catalog' && parts.length === 1) return { name: 'catalog' };
  if (a === 'catalog' && b && parts.length === 2) return { name: 'product', productId: b };
  if (a === 'settings' && parts.length === 1) return { name: 'settings' };
  if (a === 'p' && parts.length === 1) return { name: 'portfolios' };
  if (a === 'p' && b && parts.length === 2) return { name: 'portfolio', portfolioId: b };
  if (a === 'p' && b && c === 'plan' && parts.length === 3) return { name: 'plan', portfolioId: b };
  if (a === 's' && b) {
    if (parts.length === 2) return { name: 'survey', surveyId: b };
    if (c === 'suggest' && parts.length === 3) return { name: 'suggest', surveyId: b };
    if (c === 'r' && d && parts.length === 4) return { name: 'room', surveyId: b, roomId: d };
    if (c === 'r' && d && e === 'e' && f && parts.length === 6) return { name: 'entry', surveyId: b, roomId: d, entryId: f };
  }
  return { name: 'missing', hash };
}

/**
 * The hash for a route.
 *
 * @example href({ name: 'survey', surveyId: 'a b' }) //=> '#/s/a%20b'
 */
export function href(route: Route): string {
  const e = encodeURIComponent;
  switch (route.name) {
    case 'surveys':
      return '#/';
    case 'survey':
      return `#/s/${e(route.surveyId)}`;
    case 'room':
      return `#/s/${e(route.surveyId)}/r/${e(route.roomId)}`;
    case 'entry':
      return `#/s/${e(route.surveyId)}/r/${e(route.roomId)}/e/${e(route.entryId)}`;
    case 'suggest':
      return `#/s/${e(route.surveyId)}/suggest`;
    case 'portfolios':
      return '#/p';
    case 'portfolio':
      return `#/p/${e(route.portfolioId)}`;
    case 'plan':
      return `#/p/${e(route.portfolioId)}/plan`;
    case 'catalog':
      return '#/catalog';
    case 'product':
      return `#/catalog/${e(route.productId)}`;
    case 'settings':
      return '#/settings';
    case 'missing':
      return route.hash;
  }
}

/**
 * Goes to a route (replacing the current history entry when `replace`).
 *
 * @example go({ name: 'catalog' }) //=> location.hash becomes '#/catalog'
 */
export function go(route: Route, replace = false): void {
  const target = href(route);
  if (replace) {
    history.replaceState(null, '', target);
    window.dispatchEvent(new HashChangeEvent('hashchange'));
  } else location.hash = target;
}

/**
 * The current route, following the address bar.
 *
 * @example useRoute() //=> { name: 'surveys' } at '#/'
 */
export function useRoute(): Route {
  const [route, setRoute] = useState<Route>(() => parseRoute(location.hash));
  useEffect(() => {
    const follow = () => setRoute(parseRoute(location.hash));
    window.addEventListener('hashchange', follow);
    return () => window.removeEventListener('hashchange', follow);
  }, []);
  return route;
}
