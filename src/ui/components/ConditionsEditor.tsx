/**
 * Where and how the fixture is installed: the facts most swaps go wrong on
 * (enclosed, dimmed, damp, emergency, insulation) and the circuit it is on.
 */
import type { FixtureConditions, FixtureEntry } from '../../survey/model.ts';
import { changeFields, type Patch } from '../../survey/store.ts';
import { rules } from '../state/fields.ts';
import { dimmerLabels, moistureLabels, optionsOf } from '../state/labels.ts';
import type { SurveySession } from '../state/session.ts';
import { Choice, NumberField, SelectField, TextField, Toggle } from './fields.tsx';

/**
 * The conditions of one entry: enclosed, dimmer, location, emergency, insulation, circuit.
 *
 * @example <ConditionsEditor session={session} entry={entry} locale="en-US" /> //=> three switches and the circuit fields
 */
export function ConditionsEditor(props: { session: SurveySession; entry: FixtureEntry; locale: string }) {
  const { session, entry, locale } = props;
  const c = entry.conditions;
  // Only the fields changed are saved, so another window's change to another condition is kept.
  const set = (patch: Patch<FixtureConditions>) => session.updateEntry(entry.id, { conditions: changeFields(patch) });
  const optional = (key: 'breakerAmps' | 'circuitLabel') => (value: number | string | undefined) => {
    if (value === undefined || value === '') return set({ [key]: undefined });
    return key === 'breakerAmps' ? (typeof value === 'number' ? set({ breakerAmps: value }) : 'Enter a number.') : set({ circuitLabel: String(value) });
  };
  return (
    <div class="conditions">
      <div class="toggles">
        <Toggle label="Totally enclosed fixture" checked={c.enclosed} onChange={(enclosed) => set({ enclosed })} hazard testId="cond-enclosed" />
        <Toggle label="On an emergency or exit circuit" checked={c.emergencyCircuit} onChange={(emergencyCircuit) => set({ emergencyCircuit })} hazard testId="cond-emergency" />
        <Toggle label="Touching insulation (recessed)" checked={c.insulationContact} onChange={(insulationContact) => set({ insulationContact })} hazard testId="cond-insulation" />
      </div>
      <div class="grid-fields">
        <SelectField label="Dimmer on the circuit" value={c.dimmer} options={optionsOf(dimmerLabels)} onChange={(dimmer) => set({ dimmer })} testId="cond-dimmer" />
        <Choice legend="Location" name={`location-${entry.id}`} value={c.location} options={optionsOf(moistureLabels)} onChange={(location) => set({ location })} testId="cond-location" />
        <NumberField label="Circuit voltage" unit="V" value={c.circuitVolts} rule={rules.circuitVolts} locale={locale} onChange={(value) => (value === undefined ? 'Enter a number.' : set({ circuitVolts: value }))} />
        <NumberField label="Breaker rating" unit="A" value={c.breakerAmps} rule={rules.breakerAmps} locale={locale} onChange={optional('breakerAmps')} hint="To check the circuit load." />
        <TextField label="Circuit (panel / way)" value={c.circuitLabel ?? ''} onChange={(value) => optional('circuitLabel')(value)} hint="Entries with the same label are added up on one circuit." />
      </div>
    </div>
  );
}
