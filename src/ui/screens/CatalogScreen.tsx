/**
 * The user's own catalog of LED products: what the entry editor offers.
 * Add one (the figures a product cannot do without first), open one to edit
 * it (saved as typed), retire one to stop offering it (entries that use it
 * keep their copy).
 */
import { useState } from 'preact/hooks';
import type { CatalogProduct, Distribution, ProductForm } from '../../survey/model.ts';
import { AddForm } from '../components/AddForm.tsx';
import { NumberField, SelectField, TextField } from '../components/fields.tsx';
import { Section } from '../components/Section.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { inputVoltsText } from '../components/ProductFields.tsx';
import { go, href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { rules } from '../state/fields.ts';
import { distributionLabels, formLabels, optionsOf } from '../state/labels.ts';
import { useCatalog } from '../state/useSession.ts';

function ProductRow(props: { product: CatalogProduct; locale: string }) {
  const { product } = props;
  const number = (value: number) => new Intl.NumberFormat(props.locale, { maximumFractionDigits: 1 }).format(value);
  const flags = [product.dimmable && 'dimmable', product.enclosedRated && 'enclosed-rated', product.moistureRating !== 'dry' && `${product.moistureRating} rated`, product.emergencyListed && 'emergency listed'].filter(Boolean);
  return (
    <li>
      <a class="row row--link" href={href({ name: 'product', productId: product.id })} data-testid="product-row">
        <span class="row-main">
          <span class="row-title">{product.name || 'Unnamed product'}</span>
          <span class="row-line">
            {product.unitsPerFixture > 1 ? `${product.unitsPerFixture} × ` : ''}
            {number(product.wattsPerUnit)} W, {number(product.lumensPerUnit)} lm, {product.cctKelvin} K, CRI {product.cri}
            {inputVoltsText(product) ? `, ${inputVoltsText(product)}` : ''}
            {flags.length > 0 ? ` · ${flags.join(', ')}` : ''}
          </span>
          {product.example && <span class="tag">example</span>}
        </span>
        <Icon name="next" />
      </a>
    </li>
  );
}

function NewProduct(props: { onAdded: (product: CatalogProduct) => void }) {
  const { store, preferences } = useApp();
  const locale = preferences.locale;
  const [name, setName] = useState('');
  const [form, setForm] = useState<ProductForm>('screw-lamp');
  const [distribution, setDistribution] = useState<Distribution>('diffuse');
  const [watts, setWatts] = useState<number | undefined>(undefined);
  const [lumens, setLumens] = useState<number | undefined>(undefined);
  const [cct, setCct] = useState<number | undefined>(undefined);
  const [cri, setCri] = useState<number | undefined>(undefined);
  const [pf, setPf] = useState<number | undefined>(undefined);
  const [life, setLife] = useState<number | undefined>(undefined);
  const [price, setPrice] = useState<number | undefined>(undefined);
  const ready = name.trim() !== '' && [watts, lumens, cct, cri, pf, life, price].every((value) => value !== undefined);

  const add = async () => {
    if (!ready || watts === undefined || lumens === undefined || cct === undefined || cri === undefined || pf === undefined || life === undefined || price === undefined) return;
    const product = await store.addProduct({
      name: name.trim(),
      sku: '',
      form,
      tubeType: 'not-a-tube',
      unitsPerFixture: 1,
      wattsPerUnit: watts,
      lumensPerUnit: lumens,
      cctKelvin: cct,
      cri,
      powerFactor: pf,
      dimmable: false,
      enclosedRated: false,
      moistureRating: 'dry',
      insulationContactRated: false,
      emergencyListed: false,
      ratedLifeHours: life,
      distribution,
      unitCost: price,
      installMinutesPerFixture: 0,
      rebatePerFixture: 0,
      example: false,
      retired: false,
    });
    props.onAdded(product);
  };

  return (
    <AddForm
      openLabel="Add a product"
      openTestId="new-product"
      openClass="spaced"
      formLabel="New product"
      submitLabel="Add to the catalog"
      ready={ready}
      onAdd={add}
      lead={<p class="quiet">The figures from the data sheet. Ratings (dimmable, enclosed, damp…) and prices are set on the next page.</p>}
    >
      <TextField label="Product name" value={name} onChange={setName} class="field--wide" />
      <SelectField label="Form" value={form} options={optionsOf(formLabels)} onChange={setForm} />
      <SelectField label="Light distribution" value={distribution} options={optionsOf(distributionLabels)} onChange={setDistribution} />
      <NumberField label="Watts" unit="W" value={watts} rule={rules.ratedWatts} locale={locale} onChange={setWatts} />
      <NumberField label="Lumens" unit="lm" value={lumens} rule={rules.lumens} locale={locale} onChange={setLumens} />
      <NumberField label="CCT" unit="K" value={cct} rule={rules.cct} locale={locale} onChange={setCct} />
      <NumberField label="CRI" value={cri} rule={rules.cri} locale={locale} onChange={setCri} />
      <NumberField label="Power factor" value={pf} rule={rules.powerFactor} locale={locale} onChange={setPf} />
      <NumberField label="Rated life" unit="h" value={life} rule={rules.lifeHours} locale={locale} onChange={setLife} />
      <NumberField label="Price each" unit={preferences.currency} value={price} rule={rules.money} locale={locale} onChange={setPrice} />
    </AddForm>
  );
}

/**
 * The catalog screen.
 *
 * @example <CatalogScreen /> //=> the products offered and retired, and "Add a product"
 */
export function CatalogScreen() {
  const { store, preferences } = useApp();
  const locale = preferences.locale;
  const { catalog, error } = useCatalog(store);
  const active = catalog?.filter((product) => !product.retired) ?? [];
  const retired = catalog?.filter((product) => product.retired) ?? [];
  return (
    <Screen title="Catalog" section="catalog">
      <p class="quiet">Your LED products. The fixture editor offers the ones that fit each fixture.</p>
      {error && <p role="alert">{error}</p>}
      <Section title={`Offered (${active.length})`}>
        <NewProduct onAdded={(product) => go({ name: 'product', productId: product.id })} />
        {catalog === null ? <p class="quiet">Opening…</p> : <ul class="rows">{active.map((product) => <ProductRow key={product.id} product={product} locale={locale} />)}</ul>}
      </Section>
      {retired.length > 0 && (
        <Section title={`Retired (${retired.length})`}>
          <ul class="rows">
            {retired.map((product) => (
              <ProductRow key={product.id} product={product} locale={locale} />
            ))}
          </ul>
        </Section>
      )}
    </Screen>
  );
}
