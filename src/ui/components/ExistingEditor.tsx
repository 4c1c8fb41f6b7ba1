/** What is installed now: from the built-in list (published input watts) or typed in. */
import { findTypicalEquipment, typicalExistingEquipment } from '../../calc/equipment.ts';
import type { EntryResult } from '../../calc/survey.ts';
import type { ExistingEquipment, FixtureEntry } from '../../survey/model.ts';
import { changeFields, type Patch } from '../../survey/store.ts';
import { existingFromTypical } from '../state/defaults.ts';
import { rules } from '../state/fields.ts';
import type { UiFigures } from '../state/format.ts';
import { ballastLabels, optionsOf, technologyLabels } from '../state/labels.ts';
import type { SurveySession } from '../state/session.ts';
import { NumberField, SelectField, TextField } from './fields.tsx';

const custom = 'custom';

const wattsBasisWords: Record<EntryResult['wattsBasis'], string> = {
  metered: 'metered on site',
  'fixture-input': 'fixture input watts you entered',
  table: 'published wattage table',
  'lamp-rated': 'lamp label (no ballast)',
  estimated: 'estimated from the lamp watts and a typical ballast',
};

/**
 * What is installed now, from the built-in list or typed in.
 *
 * @example <ExistingEditor session={session} entry={entry} result={result} locale="en-US" currency="USD" fig={fig} /> //=> the equipment fields
 */
export function ExistingEditor(props: { session: SurveySession; entry: FixtureEntry; result: EntryResult | undefined; locale: string; currency: string; fig: UiFigures }) {
  const { session, entry, result, locale, fig } = props;
  const e = entry.existing;
  const row = findTypicalEquipment(e.technology, e.ballast, e.lampsPerFixture, e.ratedWattsPerLamp);
  // Only the fields changed are saved, so another window's change to another field is kept.
  const set = (patch: Patch<ExistingEquipment>) => session.updateEntry(entry.id, { existing: changeFields(patch) });
  const optional =
    (key: 'fixtureInputWatts' | 'meteredWattsPerFixture' | 'lumensPerLamp' | 'ballastYear' | 'lampPrice') => (value: number | undefined) =>
      set({ [key]: value });
  const required = (key: 'lampsPerFixture' | 'ratedWattsPerLamp') => (value: number | undefined) => (value === undefined ? 'Enter a number.' : set({ [key]: value }));
  const options = [...typicalExistingEquipment.map((item) => ({ value: item.key, label: `${item.label} (${item.fixtureInputWatts} W)` })), { value: custom, label: 'Something else (type it in)' }];
  return (
    <div class="grid-fields">
      <SelectField
        label="Existing equipment"
        value={row?.key ?? custom}
        options={options}
        onChange={(key) => {
          const chosen = typicalExistingEquipment.find((item) => item.key === key);
          if (!chosen) return null;
          // The listed equipment's fields, and no input watts or lumens typed for the old one.
          return set({ ...existingFromTypical(chosen), fixtureInputWatts: undefined, lumensPerLamp: undefined });
        }}
        hint={row ? `Input watts from: ${row.source}.` : 'Not in the built-in list: the input watts are worked out from the lamp watts.'}
        class="field--wide"
        testId="existing-pick"
      />
      <TextField label="Description" value={e.description} onChange={(description) => set({ description })} class="field--wide" />
      <SelectField label="Lamp type" value={e.technology} options={optionsOf(technologyLabels)} onChange={(technology) => set({ technology })} />
      <SelectField label="Ballast" value={e.ballast} options={optionsOf(ballastLabels)} onChange={(ballast) => set({ ballast })} />
      <NumberField label="Lamps per fixture" value={e.lampsPerFixture} rule={rules.lampsPerFixture} locale={locale} onChange={required('lampsPerFixture')} testId="existing-lamps" />
      <NumberField label="Watts per lamp (label)" unit="W" value={e.ratedWattsPerLamp} rule={rules.ratedWatts} locale={locale} onChange={required('ratedWattsPerLamp')} testId="existing-lamp-watts" />
      <NumberField
        label="Fixture input watts"
        unit="W"
        value={e.fixtureInputWatts}
        rule={rules.optionalWatts}
        locale={locale}
        onChange={optional('fixtureInputWatts')}
        hint={result ? `Now using ${fig.watts(result.existing.wattsPerFixture, 1)} per fixture: ${wattsBasisWords[result.wattsBasis]}. Leave empty for the table or estimate.` : undefined}
        testId="existing-input-watts"
      />
      <NumberField label="Metered watts per fixture" unit="W" value={e.meteredWattsPerFixture} rule={rules.optionalWatts} locale={locale} onChange={optional('meteredWattsPerFixture')} hint="A meter reading wins over every rated figure." testId="existing-metered" />
      <NumberField label="Lumens per lamp" unit="lm" value={e.lumensPerLamp} rule={rules.optionalLumens} locale={locale} onChange={optional('lumensPerLamp')} hint="From the lamp’s sleeve; needed to judge the light level." />
      {e.ballast === 'magnetic' && (
        <NumberField label="Ballast year (from its label)" value={e.ballastYear} rule={rules.ballastYear} locale={locale} onChange={optional('ballastYear')} hint="Ballasts made up to 1979 may contain PCBs." />
      )}
      <NumberField label="Replacement lamp price" unit={props.currency} value={e.lampPrice} rule={{ ...rules.money, optional: true }} locale={locale} digits={2} onChange={optional('lampPrice')} hint="For the maintenance saved." />
    </div>
  );
}
