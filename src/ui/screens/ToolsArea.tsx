/** The catalog and settings screens, loaded when first visited. */
import type { Route } from '../router.ts';
import { CatalogScreen } from './CatalogScreen.tsx';
import { ProductScreen } from './ProductScreen.tsx';
import { SettingsScreen } from './SettingsScreen.tsx';

export type ToolsRoute = Extract<Route, { name: 'catalog' | 'product' | 'settings' }>;

/**
 * The catalog and settings screens by route.
 *
 * @example <ToolsArea route={{ name: 'settings' }} /> //=> the settings screen
 */
export function ToolsArea(props: { route: ToolsRoute }) {
  const { route } = props;
  if (route.name === 'catalog') return <CatalogScreen />;
  if (route.name === 'product') return <ProductScreen productId={route.productId} />;
  return <SettingsScreen />;
}
