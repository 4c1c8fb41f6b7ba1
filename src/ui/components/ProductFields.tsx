/**
 * The specification of an LED product, field by field: used for a product in
 * the catalog and for a custom product typed on site for one entry.
 */
import type { ProposedProduct } from '../../survey/model.ts';
import type { Patch } from '../../survey/store.ts';
import { rules } from '../state/fields.ts';
import { distributionLabels, formLabels, moistureLabels, optionsOf, tubeLabels } from '../state/labels.ts';
import { Choice, NumberField, SelectField, TextField, Toggle, type Commit } from './fields.tsx';

/** The fields both kinds of product share. */
export type ProductSpec = Omit<ProposedProduct, 'catalogId'>;

/** A change to some fields of a product; a field given as `undefined` is removed (optional fields only). */
export type ProductPatch = Patch<ProductSpec>;

/** Rated input voltage, the limits the survey file accepts (`inputVoltsMin` / `inputVoltsMax`). */
const inputVoltsRule = { min: 1, max: 1000, optional: true };

/**
 * A product's rated input voltage as a short phrase, or '' when neither end is recorded.
 *
 * @example inputVoltsText({ inputVoltsMin: 120, inputVoltsMax: 277 }) //=> '120–277 V'
 * @example inputVoltsText({ inputVoltsMin: 120, inputVoltsMax: 120 }) //=> '120 V'
 */
export function inputVoltsText(spec: Pick<ProductSpec, 'inputVoltsMin' | 'inputVoltsMax'>): string {
  const { inputVoltsMin: low, inputVoltsMax: high } = spec;
  if (low === undefined && high === undefined) return '';
  if (low === high) return `${low} V`;
  return `${low ?? '?'}–${high ?? '?'} V`;
}

/**
 * Why a typed end of the input-voltage range cannot be kept beside the other
 * end (lowest above highest), or null when it can.
 *
 * @example voltsOrderProblem('lowest', 277, { inputVoltsMax: 120 }) //=> 'Must not be above the highest (120 V).'
 */
export function voltsOrderProblem(end: 'lowest' | 'highest', volts: number | undefined, spec: Pick<ProductSpec, 'inputVoltsMin' | 'inputVoltsMax'>): string | null {
  if (volts === undefined) return null;
  if (end === 'lowest' && spec.inputVoltsMax !== undefined && volts > spec.inputVoltsMax) return `Must not be above the highest (${spec.inputVoltsMax} V).`;
  if (end === 'highest' && spec.inputVoltsMin !== undefined && volts < spec.inputVoltsMin) return `Must not be below the lowest (${spec.inputVoltsMin} V).`;
  return null;
}

/**
 * Every field of an LED product specification.
 *
 * @example <ProductFields spec={product} locale="en-US" currency="USD" onChange={save} idPrefix="p1" /> //=> the product fields
 */
export function ProductFields(props: { spec: ProductSpec; locale: string; currency: string; onChange: (patch: ProductPatch) => string | null; idPrefix: string }) {
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
      {/* Each end saves on its own; emptying it removes the value (not recorded). */}
      <NumberField
        label="Input voltage, lowest"
        unit="V"
        value={spec.inputVoltsMin}
        rule={inputVoltsRule}
        locale={locale}
        onChange={(inputVoltsMin) => voltsOrderProblem('lowest', inputVoltsMin, spec) ?? onChange({ inputVoltsMin })}
        hint="As rated by the maker; leave empty when not known."
        testId="product-volts-min"
      />
      <NumberField
        label="Input voltage, highest"
        unit="V"
        value={spec.inputVoltsMax}
        rule={inputVoltsRule}
        locale={locale}
        onChange={(inputVoltsMax) => voltsOrderProblem('highest', inputVoltsMax, spec) ?? onChange({ inputVoltsMax })}
        hint="The same as the lowest for a single-voltage product."
        testId="product-volts-max"
      />
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
