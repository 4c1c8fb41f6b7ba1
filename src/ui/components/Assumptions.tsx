/**
 * The assumptions behind the figures. Each published default says where it
 * comes from (BPA for the HVAC factor, eGRID or the UK factors for CO2,
 * FEMP for the discount rate…); a value the user types wins over it.
 */
import type { SurveyResult } from '../../calc/survey.ts';
import { buildingOperatingDefaults, hvacInteractiveDefaults } from '../../calc/energy.ts';
import { egridSubregions, ukGridFactors } from '../../calc/emissions.ts';
import type { GridFactorChoice, Survey } from '../../survey/model.ts';
import { changeFields } from '../../survey/store.ts';
import { defaultDiscountRatePerYear, newestUkYear } from '../state/defaults.ts';
import { rules } from '../state/fields.ts';
import type { UiFigures } from '../state/format.ts';
import { buildingLabels, heatingLabels, optionsOf, unitsLabels } from '../state/labels.ts';
import type { SurveySession } from '../state/session.ts';
import { NumberField, SelectField, TextField } from './fields.tsx';

const percent = (fraction: number | undefined) => (fraction === undefined ? undefined : Math.round(fraction * 1e6) / 1e4);

const gridKinds = [
  { value: 'egrid', label: 'US: EPA eGRID subregion' },
  { value: 'uk', label: 'UK: government conversion factor' },
  { value: 'custom', label: 'My own factor' },
] as const;

function GridChoice(props: { session: SurveySession; survey: Survey; source: string }) {
  const { session, survey } = props;
  const grid = survey.grid;
  const set = (next: GridFactorChoice) => session.updateSurvey({ grid: next });
  return (
    <>
      <SelectField
        label="Grid emission factor"
        value={grid.kind}
        options={gridKinds}
        onChange={(kind) =>
          set(kind === 'egrid' ? { kind, subregion: 'US' } : kind === 'uk' ? { kind, year: newestUkYear } : { kind, kgCo2PerKwh: 0.2, label: 'My grid factor' })
        }
        hint={props.source}
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
        <SelectField
          label="Factor year"
          value={String(grid.year)}
          options={Object.keys(ukGridFactors).map((year) => ({ value: year, label: year }))}
          onChange={(year) => set({ kind: 'uk', year: Number(year) })}
        />
      )}
      {grid.kind === 'custom' && (
        <>
          <NumberField label="kg CO2 per kWh" value={grid.kgCo2PerKwh} rule={{ min: 0, max: 2.5 }} locale={survey.locale} digits={5} onChange={(value) => (value === undefined ? 'Enter a number.' : set({ ...grid, kgCo2PerKwh: value }))} />
          <TextField label="Where the factor comes from" value={grid.label} onChange={(label) => set({ ...grid, label })} />
        </>
      )}
    </>
  );
}

/**
 * The survey's assumptions, each published default named with its source.
 *
 * @example <Assumptions session={session} survey={survey} result={result} fig={fig} /> //=> building, money, CO2 and units fields
 */
export function Assumptions(props: { session: SurveySession; survey: Survey; result: SurveyResult | null; fig: UiFigures }) {
  const { session, survey, result, fig } = props;
  const m = survey.money;
  const s = survey.savings;
  const hvac = hvacInteractiveDefaults(survey.buildingType, survey.heatingType);
  const operating = buildingOperatingDefaults[survey.buildingType];
  // Only the fields changed are saved (another window may change the others).
  const money = (patch: Partial<Survey['money']>) => session.updateSurvey({ money: changeFields<Survey['money']>(patch) });
  const savings = (patch: { [K in keyof Survey['savings']]?: Survey['savings'][K] | undefined }) => session.updateSurvey({ savings: changeFields<Survey['savings']>(patch) });
  const required = (apply: (value: number) => string | null) => (value: number | undefined) => (value === undefined ? 'Enter a number.' : apply(value));
  const currencyCode = m.currency;
  return (
    <div class="assumptions">
      <h3>Building</h3>
      <div class="grid-fields">
        <SelectField label="Building type" value={survey.buildingType} options={optionsOf(buildingLabels)} onChange={(buildingType) => session.updateSurvey({ buildingType })} />
        <SelectField label="Heating" value={survey.heatingType} options={optionsOf(heatingLabels)} onChange={(heatingType) => session.updateSurvey({ heatingType })} />
        <NumberField
          label="HVAC energy factor (1 + HVACc)"
          value={s.hvacEnergyFactor}
          rule={{ min: 0, max: 3, optional: true }}
          locale={survey.locale}
          onChange={(value) => savings({ hvacEnergyFactor: value })}
          hint={`Leave empty for ${fig.number(hvac.energyFactor, 2)}: ${hvac.source}.`}
        />
        <NumberField
          label="Peak coincidence factor"
          value={s.coincidenceFactor}
          rule={{ min: 0, max: 1, optional: true }}
          locale={survey.locale}
          onChange={(value) => savings({ coincidenceFactor: value })}
          hint={`Leave empty for ${fig.number(operating.coincidenceFactor, 2)} (${result?.factors.sources.operating ?? 'from memory'}).`}
        />
        <NumberField
          label="HVAC demand factor (1 + HVACd)"
          value={s.hvacDemandFactor}
          rule={{ min: 0, max: 3, optional: true }}
          locale={survey.locale}
          onChange={(value) => savings({ hvacDemandFactor: value })}
          hint="Leave empty for 1.00: no published default is adopted; enter your program's figure."
        />
      </div>
      <h3>Energy and money</h3>
      <div class="grid-fields">
        <NumberField label="Energy price" unit={`${currencyCode}/kWh`} value={m.energyRatePerKwh} rule={{ min: 0, max: 100 }} locale={survey.locale} digits={4} onChange={required((energyRatePerKwh) => money({ energyRatePerKwh }))} hint="From the client’s bill (all-in price per kWh)." testId="energy-rate" />
        <NumberField label="Demand charge" unit={`${currencyCode}/kW·month`} value={m.demandChargePerKwMonth} rule={{ min: 0, max: 10_000 }} locale={survey.locale} onChange={required((demandChargePerKwMonth) => money({ demandChargePerKwMonth }))} hint="0 when the tariff has none." />
        <NumberField label="Price rise above inflation" unit="%/yr" value={percent(m.energyEscalationPerYear)} rule={{ min: -50, max: 50 }} locale={survey.locale} onChange={required((value) => money({ energyEscalationPerYear: value / 100 }))} />
        <NumberField label="Discount rate (real)" unit="%/yr" value={percent(m.discountRatePerYear)} rule={{ min: 0, max: 50 }} locale={survey.locale} onChange={required((value) => money({ discountRatePerYear: value / 100 }))} hint={`New surveys start at ${fig.percent(defaultDiscountRatePerYear)}: FEMP real discount rate (NIST Handbook 135 supplement).`} />
        <NumberField label="Study period" unit="years" value={m.analysisYears} rule={{ min: 1, max: 40, integer: true }} locale={survey.locale} onChange={required((analysisYears) => money({ analysisYears }))} />
        <NumberField label="Labour rate" unit={`${currencyCode}/h`} value={m.labourRatePerHour} rule={{ min: 0, max: 10_000 }} locale={survey.locale} onChange={required((labourRatePerHour) => money({ labourRatePerHour }))} />
        <NumberField label="Markup" unit="%" value={percent(m.markupFraction)} rule={{ min: 0, max: 500 }} locale={survey.locale} onChange={required((value) => money({ markupFraction: value / 100 }))} />
        <NumberField label="Sales tax" unit="%" value={percent(m.taxFraction)} rule={{ min: 0, max: 100 }} locale={survey.locale} onChange={required((value) => money({ taxFraction: value / 100 }))} />
        <SelectField
          label="Tax applies to"
          value={m.taxBase}
          options={[
            { value: 'materials', label: 'Materials only' },
            { value: 'everything', label: 'Everything' },
          ]}
          onChange={(taxBase) => money({ taxBase })}
        />
        <NumberField label="Lamp recycling, each" unit={currencyCode} value={m.lampRecyclingCostEach} rule={rules.money} locale={survey.locale} onChange={required((lampRecyclingCostEach) => money({ lampRecyclingCostEach }))} hint="Fluorescent and HID lamps contain mercury: recycle them." />
        <NumberField label="Ballast disposal, each" unit={currencyCode} value={m.ballastDisposalCostEach} rule={rules.money} locale={survey.locale} onChange={required((ballastDisposalCostEach) => money({ ballastDisposalCostEach }))} />
        <NumberField label="Minutes to change a lamp" unit="min" value={m.relampMinutes} rule={{ min: 0, max: 600 }} locale={survey.locale} onChange={required((relampMinutes) => money({ relampMinutes }))} hint="For the maintenance saved; 0 leaves it out." />
      </div>
      <h3>CO2</h3>
      <div class="grid-fields">
        <GridChoice session={session} survey={survey} source={result?.factors.sources.grid ?? ''} />
      </div>
      <h3>Units and language</h3>
      <div class="grid-fields">
        <SelectField label="Units" value={survey.units} options={optionsOf(unitsLabels)} onChange={(units) => session.updateSurvey({ units })} testId="survey-units" />
        <TextField label="Currency (ISO code)" value={m.currency} onChange={(currency) => money({ currency: currency.trim().toUpperCase() })} hint="For example USD, EUR, GBP." maxLength={3} />
        <TextField label="Number format (language tag)" value={survey.locale} onChange={(locale) => session.updateSurvey({ locale: locale.trim() })} hint="For example en-US, en-GB, de-DE." maxLength={35} />
      </div>
    </div>
  );
}
