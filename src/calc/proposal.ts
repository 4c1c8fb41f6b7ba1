/**
 * The one rule for turning a catalog product into an entry's proposal, shared
 * by the picker, the automatic choice, schedule import and the demo data.
 */
import type { CatalogProduct, ProposedProduct } from '../survey/model.ts';

/**
 * Copies a catalog product into an entry's proposal (the entry keeps its own
 * copy, so later catalog edits do not change a quote already given); the
 * catalog id is kept as the link.
 *
 * @example proposalFromProduct({ id: 'p1', sku: 'X', example: false, retired: false, name: 'A19', … }) //=> { catalogId: 'p1', name: 'A19', … }
 */
export function proposalFromProduct(product: CatalogProduct): ProposedProduct {
  const { id, example: _example, retired: _retired, sku: _sku, ...spec } = product;
  return { catalogId: id, ...spec };
}
