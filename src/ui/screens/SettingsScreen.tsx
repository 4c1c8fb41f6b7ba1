/**
 * Settings: how Lampwalk looks, the company on reports and quotes, the
 * defaults a new survey starts from, document options, and what was
 * recently deleted (to bring back).
 */
import { useEffect, useId, useState } from 'preact/hooks';
import { egridSubregions, ukGridFactors } from '../../calc/emissions.ts';
import type { GridFactorChoice } from '../../survey/model.ts';
import type { TrashSummary } from '../../survey/store.ts';
import { Choice, NumberField, SelectField, TextField } from '../components/fields.tsx';
import { Section } from '../components/Section.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { useApp } from '../state/context.ts';
import { gridFor } from '../state/defaults.ts';
import { messageOf } from '../state/errors.ts';
import { prepareLogo } from '../state/images.ts';
import { buildingLabels, heatingLabels, optionsOf, unitsLabels } from '../state/labels.ts';
import type { Theme } from '../state/preferences.ts';

const themes: { value: Theme; label: string }[] = [
  { value: 'auto', label: 'Like the device' },
  { value: 'light', label: 'Light' },
  { value: 'dark', label: 'Dark' },
  { value: 'sun', label: 'Sunlight (high contrast)' },
];

function LogoPicker() {
  const { preferences, setPreferences, notify } = useApp();
  const inputId = useId();
  const pick = async (event: Event) => {
    const input = event.currentTarget as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    try {
      const refused = setPreferences({ logo: await prepareLogo(file) });
      if (refused) notify({ tone: 'error', text: refused });
    } catch (error) {
      notify({ tone: 'error', text: `The logo could not be used. ${messageOf(error)}` });
    }
  };
  return (
    <div class="logo-picker">
      {preferences.logo && <img src={preferences.logo.dataUrl} alt="Your logo" class="logo-preview" />}
      <div class="actions">
        <input id={inputId} class="visually-hidden" type="file" accept="image/png,image/jpeg" onChange={pick} />
        <label class="button file-button" for={inputId}>
          <Icon name="fileIn" />
          {preferences.logo ? 'Change the logo' : 'Add a logo'}
        </label>
        {preferences.logo && (
          <button type="button" class="button button--quiet" onClick={() => setPreferences({ logo: null })}>
            Remove the logo
          </button>
        )}
      </div>
    </div>
  );
}

function DefaultGrid() {
  const { preferences, setPreferences } = useApp();
  const grid = gridFor(preferences);
  const set = (next: GridFactorChoice) => setPreferences({ grid: next });
  return (
    <>
      <SelectField
        label="Grid emission factor"
        value={grid.kind}
        options={[
          { value: 'egrid', label: 'US: EPA eGRID subregion' },
          { value: 'uk', label: 'UK: government conversion factor' },
          { value: 'custom', label: 'My own factor' },
        ]}
        onChange={(kind) =>
          set(kind === 'egrid' ? { kind, subregion: 'US' } : kind === 'uk' ? { kind, year: Math.max(...Object.keys(ukGridFactors).map(Number)) } : { kind, kgCo2PerKwh: 0.2, label: 'My grid factor' })
        }
      />
      {grid.kind === 'egrid' && (
        <SelectField
          label="eGRID subregion"
          value={grid.subregion}
          options={Object.entries(egridSubregions).map(([value, row]) => ({ value, label: `${value} — ${row.label}` }))}
          onChange={(subregion) => set({ kind: 'egrid', subregion })}
        />
      )}
      {grid.kind === 'uk' && (
        <SelectField label="Factor year" value={String(grid.year)} options={Object.keys(ukGridFactors).map((year) => ({ value: year, label: year }))} onChange={(year) => set({ kind: 'uk', year: Number(year) })} />
      )}
      {grid.kind === 'custom' && (
        <>
          <NumberField label="kg CO2 per kWh" value={grid.kgCo2PerKwh} rule={{ min: 0, max: 2.5 }} locale={preferences.locale} digits={5} onChange={(value) => (value === undefined ? 'Enter a number.' : set({ ...grid, kgCo2PerKwh: value }))} />
          <TextField label="Where the factor comes from" value={grid.label} onChange={(label) => set({ ...grid, label })} />
        </>
      )}
    </>
  );
}

function RecentlyDeleted() {
  const { store, notify, preferences } = useApp();
  const [items, setItems] = useState<TrashSummary[] | null>(null);
  const [version, setVersion] = useState(0);
  useEffect(() => {
    store.listTrash().then(setItems, (error: unknown) => notify({ tone: 'error', text: messageOf(error) }));
  }, [version]);
  const date = new Intl.DateTimeFormat(preferences.locale, { dateStyle: 'medium', timeStyle: 'short' });
  if (items === null) return <p class="quiet">Opening…</p>;
  if (items.length === 0) return <p class="quiet">Nothing deleted in the last 30 days.</p>;
  const kinds = { survey: 'Survey', room: 'Room', entry: 'Fixture', photo: 'Photo', portfolio: 'Portfolio' } as const;
  return (
    <ul class="rows">
      {items.map((item) => (
        <li key={item.id} class="row">
          <span class="row-main">
            <span class="row-title">
              {kinds[item.kind]}: {item.label}
            </span>
            <span class="row-line">
              Deleted {date.format(new Date(item.deletedAt))}; kept until {date.format(new Date(item.restorableUntil))}
            </span>
          </span>
          <button
            type="button"
            class="button"
            onClick={async () => {
              try {
                await store.restoreFromTrash(item.id);
                notify({ tone: 'info', text: `“${item.label}” is back.` });
                setVersion((v) => v + 1);
              } catch (error) {
                notify({ tone: 'error', text: messageOf(error) });
              }
            }}
          >
            <Icon name="undo" />
            Bring back
          </button>
        </li>
      ))}
    </ul>
  );
}

/**
 * The settings screen.
 *
 * @example <SettingsScreen /> //=> look, company, defaults, documents, recently deleted
 */
export function SettingsScreen() {
  const { preferences: p, setPreferences: set } = useApp();
  const number = (apply: (value: number) => string | null) => (value: number | undefined) => (value === undefined ? 'Enter a number.' : apply(value));
  return (
    <Screen title="Settings" section="settings">
      <p class="quiet">Kept on this device. Each survey keeps its own copy of the defaults it started with.</p>
      <Section title="Look">
        <Choice legend="Colours" name="theme" value={p.theme} options={themes} onChange={(theme) => set({ theme })} testId="theme-choice" />
      </Section>
      <Section title="Your company (on reports and quotes)">
        <div class="grid-fields">
          <TextField label="Company name" value={p.companyName} onChange={(companyName) => set({ companyName })} maxLength={200} autoComplete="organization" />
          <TextField label="Your name (walked by)" value={p.preparedBy} onChange={(preparedBy) => set({ preparedBy })} maxLength={200} autoComplete="name" />
          <TextField label="Address, phone, licence number" value={p.companyDetails} onChange={(companyDetails) => set({ companyDetails })} multiline maxLength={1000} hint="One per line." class="field--wide" />
        </div>
        <LogoPicker />
      </Section>
      <Section title="New surveys start with">
        <div class="grid-fields">
          <SelectField label="Units" value={p.units} options={optionsOf(unitsLabels)} onChange={(units) => set({ units })} />
          <TextField label="Currency (ISO code)" value={p.currency} onChange={(currency) => set({ currency: currency.trim().toUpperCase() })} maxLength={3} hint="For example USD, EUR, GBP." />
          <TextField label="Number format (language tag)" value={p.locale} onChange={(locale) => set({ locale: locale.trim() })} maxLength={35} hint="For example en-US, en-GB, de-DE." />
          <SelectField label="Building type" value={p.buildingType} options={optionsOf(buildingLabels)} onChange={(buildingType) => set({ buildingType })} />
          <SelectField label="Heating" value={p.heatingType} options={optionsOf(heatingLabels)} onChange={(heatingType) => set({ heatingType })} />
          <NumberField label="Energy price" unit={`${p.currency}/kWh`} value={p.energyRatePerKwh} rule={{ min: 0, max: 100 }} locale={p.locale} digits={4} onChange={number((energyRatePerKwh) => set({ energyRatePerKwh }))} />
          <NumberField label="Demand charge" unit={`${p.currency}/kW·month`} value={p.demandChargePerKwMonth} rule={{ min: 0, max: 10_000 }} locale={p.locale} onChange={number((demandChargePerKwMonth) => set({ demandChargePerKwMonth }))} />
          <NumberField label="Labour rate" unit={`${p.currency}/h`} value={p.labourRatePerHour} rule={{ min: 0, max: 10_000 }} locale={p.locale} onChange={number((labourRatePerHour) => set({ labourRatePerHour }))} />
          <NumberField label="Markup" unit="%" value={Math.round(p.markupFraction * 1e4) / 100} rule={{ min: 0, max: 500 }} locale={p.locale} onChange={number((value) => set({ markupFraction: value / 100 }))} />
          <NumberField label="Sales tax" unit="%" value={Math.round(p.taxFraction * 1e4) / 100} rule={{ min: 0, max: 100 }} locale={p.locale} onChange={number((value) => set({ taxFraction: value / 100 }))} />
          <NumberField label="Circuit voltage" unit="V" value={p.circuitVolts} rule={{ min: 12, max: 1000 }} locale={p.locale} onChange={number((circuitVolts) => set({ circuitVolts }))} />
          <DefaultGrid />
        </div>
      </Section>
      <Section title="Documents">
        <div class="grid-fields">
          <NumberField label="Quotes valid for" unit="days" value={p.quoteValidDays} rule={{ min: 1, max: 365, integer: true }} locale={p.locale} onChange={number((quoteValidDays) => set({ quoteValidDays }))} />
          <NumberField label="Spare stock on order lists" unit="%" value={p.sparePercent} rule={{ min: 0, max: 100 }} locale={p.locale} onChange={number((sparePercent) => set({ sparePercent }))} />
          <SelectField
            label="Decimals in CSV files"
            value={p.csvDecimal}
            options={[
              { value: '.', label: 'Point (1.5), comma between columns' },
              { value: ',', label: 'Comma (1,5), semicolon between columns' },
            ]}
            onChange={(csvDecimal) => set({ csvDecimal })}
          />
        </div>
      </Section>
      <Section title="Recently deleted">
        <RecentlyDeleted />
      </Section>
      <Section title="About the figures">
        <p>
          Lampwalk’s figures are estimates, not guarantees. Its warnings point at hazards — mains wiring, ballast bypass, heat in enclosed or insulated
          fixtures, emergency lighting, PCB ballasts and mercury lamps — but do not replace local electrical and building codes or a licensed
          electrician, who must do any wiring work.
        </p>
      </Section>
    </Screen>
  );
}
