/** One catalog product, edited in place (saved as typed), and retired when no longer offered. */
import { useEffect, useState } from 'preact/hooks';
import type { CatalogProduct } from '../../survey/model.ts';
import type { NewProduct, Patch } from '../../survey/store.ts';
import { catalogProductSchema, problemsAgainst } from '../../survey/validate.ts';
import { TextField, Toggle } from '../components/fields.tsx';
import { Section } from '../components/Section.tsx';
import { Screen } from '../components/Layout.tsx';
import { ProductFields, type ProductSpec } from '../components/ProductFields.tsx';
import { SaveStatus } from '../components/SaveStatus.tsx';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { registerQueue } from '../state/flush.ts';
import { applyPatch } from '../state/session.ts';
import { SaveQueue, type QueueStatus } from '../state/queue.ts';

const queue = new SaveQueue(messageOf);
registerQueue(queue);

/**
 * One catalog product, edited in place.
 *
 * @example <ProductScreen productId="example-a19-basic" /> //=> its specification, saved as typed
 */
export function ProductScreen(props: { productId: string }) {
  const { store, preferences } = useApp();
  const [product, setProduct] = useState<CatalogProduct | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [status, setStatus] = useState<QueueStatus>(queue.status);

  useEffect(() => queue.subscribe(setStatus), []);
  useEffect(() => {
    store.getProduct(props.productId).then(setProduct, (failure: unknown) => setError(messageOf(failure)));
  }, [props.productId]);

  const change = (patch: Patch<ProductSpec & Pick<CatalogProduct, 'retired' | 'sku'>>): string | null => {
    if (!product) return null;
    // A field given as undefined is removed (an optional value emptied).
    const next = applyPatch<CatalogProduct>(product, patch);
    const [problem] = problemsAgainst(catalogProductSchema, next);
    if (problem) return `${problem.path}: ${problem.message}`;
    setProduct(next);
    queue
      .patch(`product:${product.id}`, patch as Patch<NewProduct>, (merged) => store.updateProduct(product.id, merged))
      .catch(() => store.getProduct(product.id).then(setProduct, () => undefined));
    return null;
  };

  const back = { route: { name: 'catalog' } as const, label: 'Catalog' };
  if (error) {
    return (
      <Screen title="Product not found" section="catalog" back={back}>
        <p role="alert">{error}</p>
      </Screen>
    );
  }
  if (!product) {
    return (
      <Screen title="" section="catalog" back={back}>
        <p role="status">Opening…</p>
      </Screen>
    );
  }
  return (
    <Screen title={product.name || 'Unnamed product'} section="catalog" back={back} aside={<SaveStatus status={status} />}>
      {product.example && <p class="banner">An example product that came with Lampwalk (invented figures). Edit it or retire it.</p>}
      <Section title="Specification">
        <ProductFields spec={product} locale={preferences.locale} currency={preferences.currency} onChange={change} idPrefix={`product-${product.id}`} />
      </Section>
      <Section title="In the catalog">
        <div class="grid-fields">
          <TextField label="SKU / order code" value={product.sku} onChange={(sku) => change({ sku })} />
          <Toggle label="Retired: no longer offered for new entries" checked={product.retired} onChange={(retired) => change({ retired })} testId="product-retired" />
        </div>
        <p class="quiet">Entries already proposing this product keep their own copy, so a quote already given does not change.</p>
      </Section>
    </Screen>
  );
}
