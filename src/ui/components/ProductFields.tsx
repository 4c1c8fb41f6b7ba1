/**
 * The specification of an LED product, field by field: used for a product in
 * the catalog and for a custom product typed on site for one entry.
 */
import type { ProposedProduct } from '../../survey/model.ts';
import { rules } from '../state/fields.ts';
import { distributionLabels, formLabels, moistureLabels, optionsOf, tubeLabels } from '../state/labels.ts';
import { Choice, NumberField, SelectField, TextField, Toggle, type Commit } from './fields.tsx';

/** The fields both kinds of product share. */
export type ProductSpec = Omit<ProposedProduct, 'catalogId'>;

/**
 * Every field of an LED product specification.
 *
 * @example <ProductFields spec={product} locale="en-US" currency="USD" onChange={save} idPrefix="p1" /> //=> the product fields
 */
export function ProductFields(props: { spec: ProductSpec; locale: string; currency: string; onChange: (patch: Partial<ProductSpec>) => string | null; idPrefix: string }) {
  const { spec, locale, currency, onChange } = props;
  const number =
    (key: keyof ProductSpec): Commit<number | undefined> =>
    (value) =>
      value === undefined ? 'Enter a number.' : onChange({ [key]: value });
  return (
    <div class="grid-fields">
      <TextField label="Product name" value={spec.name} onChange={(name) => onChange({ name })} class="field--wide" testId="product-name" />
      <SelectField label="Form" value={spec.form} options={optionsOf(formLabels)} onChange={(form) => onChange(form === 'linear-tube' ? { form } : { form, tubeType: 'not-a-tube' })} />
      {spec.form === 'linear-tube' && <SelectField label="Tube type" value={spec.tubeType} options={optionsOf(tubeLabels)} onChange={(tubeType) => onChange({ tubeType })} />}
      <NumberField label="Per fixture" unit="units" value={spec.unitsPerFixture} rule={rules.lampsPerFixture} locale={locale} onChange={number('unitsPerFixture')} hint="Tubes in a troffer; 1 for a luminaire." />
      <NumberField label="Watts each" unit="W" value={spec.wattsPerUnit} rule={rules.ratedWatts} locale={locale} onChange={number('wattsPerUnit')} testId="product-watts" />
      <NumberField label="Lumens each" unit="lm" value={spec.lumensPerUnit} rule={rules.lumens} locale={locale} onChange={number('lumensPerUnit')} testId="product-lumens" />
      <NumberField label="CCT" unit="K" value={spec.cctKelvin} rule={rules.cct} locale={locale} onChange={number('cctKelvin')} />
      <NumberField label="CRI" value={spec.cri} rule={rules.cri} locale={locale} onChange={number('cri')} />
      <NumberField label="Power factor" value={spec.powerFactor} rule={rules.powerFactor} locale={locale} onChange={number('powerFactor')} />
      <NumberField label="Rated life" unit="h" value={spec.ratedLifeHours} rule={rules.lifeHours} locale={locale} onChange={number('ratedLifeHours')} />
      <SelectField label="Light distribution" value={spec.distribution} options={optionsOf(distributionLabels)} onChange={(distribution) => onChange({ distribution })} />
      <Toggle label="Dimmable" checked={spec.dimmable} onChange={(dimmable) => onChange({ dimmable })} />
      <Toggle label="Rated for enclosed fixtures" checked={spec.enclosedRated} onChange={(enclosedRated) => onChange({ enclosedRated })} />
      <Toggle label="IC-rated (insulation contact)" checked={spec.insulationContactRated} onChange={(insulationContactRated) => onChange({ insulationContactRated })} />
      <Toggle label="Listed for emergency circuits" checked={spec.emergencyListed} onChange={(emergencyListed) => onChange({ emergencyListed })} />
      <Choice legend="Rated for" name={`${props.idPrefix}-moisture`} value={spec.moistureRating} options={optionsOf(moistureLabels)} onChange={(moistureRating) => onChange({ moistureRating })} />
      <NumberField label="Price each" unit={currency} value={spec.unitCost} rule={rules.money} locale={locale} digits={2} onChange={number('unitCost')} />
      <NumberField label="Install time per fixture" unit="min" value={spec.installMinutesPerFixture} rule={rules.installMinutes} locale={locale} onChange={number('installMinutesPerFixture')} />
      <NumberField label="Rebate per fixture" unit={currency} value={spec.rebatePerFixture} rule={rules.money} locale={locale} digits={2} onChange={number('rebatePerFixture')} />
    </div>
  );
}
