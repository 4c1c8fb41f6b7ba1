/**
 * Adding a fixture fast: one tap on a common kind of existing equipment
 * (from the built-in list with its published input watts) adds it and opens
 * it; "something else" takes the few figures a custom fixture needs.
 */
import { useState } from 'preact/hooks';
import { typicalExistingEquipment } from '../../calc/equipment.ts';
import type { BallastKind, ExistingEquipment, ExistingTechnology, Survey } from '../../survey/model.ts';
import { go } from '../router.ts';
import { useApp } from '../state/context.ts';
import { existingFromTypical, newEntryFields } from '../state/defaults.ts';
import { messageOf } from '../state/errors.ts';
import { rules } from '../state/fields.ts';
import { ballastLabels, optionsOf, technologyLabels } from '../state/labels.ts';
import type { SurveySession } from '../state/session.ts';
import { NumberField, SelectField, TextField } from './fields.tsx';
import { Icon } from './Icon.tsx';

/**
 * Circuit volts for a new entry: the survey's latest entry, else the user's default.
 *
 * @example likelyVolts(demoSurvey(), 230) //=> 120
 */
export function likelyVolts(survey: Survey, fallback: number): number {
  for (let r = survey.rooms.length - 1; r >= 0; r--) {
    const entries = survey.rooms[r]!.entries;
    const last = entries[entries.length - 1];
    if (last) return last.conditions.circuitVolts;
  }
  return fallback;
}

function CustomFixture(props: { onAdd: (existing: ExistingEquipment) => Promise<void>; locale: string }) {
  const [technology, setTechnology] = useState<ExistingTechnology>('linear-t8');
  const [ballast, setBallast] = useState<BallastKind>('electronic');
  const [lamps, setLamps] = useState<number | undefined>(undefined);
  const [watts, setWatts] = useState<number | undefined>(undefined);
  const [description, setDescription] = useState('');
  const ready = lamps !== undefined && watts !== undefined;
  return (
    <form
      class="subpanel"
      aria-label="Something else"
      onSubmit={(event) => {
        event.preventDefault();
        if (!ready) return;
        void props.onAdd({
          technology,
          ballast,
          lampsPerFixture: lamps,
          ratedWattsPerLamp: watts,
          description: description.trim() || `${lamps} × ${watts} W ${technologyLabels[technology].toLowerCase()}`,
        });
      }}
    >
      <div class="grid-fields">
        <SelectField label="Lamp type" value={technology} options={optionsOf(technologyLabels)} onChange={setTechnology} />
        <SelectField label="Ballast" value={ballast} options={optionsOf(ballastLabels)} onChange={setBallast} />
        <NumberField label="Lamps per fixture" value={lamps} rule={rules.lampsPerFixture} locale={props.locale} onChange={setLamps} />
        <NumberField label="Watts per lamp (label)" unit="W" value={watts} rule={rules.ratedWatts} locale={props.locale} onChange={setWatts} />
        <TextField label="Description" value={description} onChange={setDescription} hint="As you would say it: “wall bulkhead, 2D 28 W”." />
      </div>
      <button type="submit" class="button button--primary" disabled={!ready}>
        Add this fixture
      </button>
    </form>
  );
}

/**
 * The "add a fixture" button and the list of common existing equipment.
 *
 * @example <QuickAdd session={session} survey={survey} roomId={room.id} /> //=> a button; a tap on a kind adds it and opens it
 */
export function QuickAdd(props: { session: SurveySession; survey: Survey; roomId: string }) {
  const { preferences, notify } = useApp();
  const [open, setOpen] = useState(false);
  const [custom, setCustom] = useState(false);
  const [busy, setBusy] = useState(false);
  const volts = likelyVolts(props.survey, preferences.circuitVolts);

  const add = async (existing: ExistingEquipment) => {
    setBusy(true);
    try {
      const entry = await props.session.addEntry(props.roomId, newEntryFields(existing, volts));
      go({ name: 'entry', surveyId: props.survey.id, roomId: props.roomId, entryId: entry.id });
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    } finally {
      setBusy(false);
    }
  };

  if (!open) {
    return (
      <button type="button" class="button button--primary button--big spaced" onClick={() => setOpen(true)} data-testid="add-fixture" aria-expanded="false">
        <Icon name="plus" />
        Add a fixture
      </button>
    );
  }
  return (
    <div class="quick-add" role="group" aria-label="What is there now?">
      <div class="quick-add-head">
        <h3>What is there now?</h3>
        <button type="button" class="icon-button" onClick={() => setOpen(false)} aria-label="Close the list">
          <Icon name="close" />
        </button>
      </div>
      <ul class="pick-grid">
        {typicalExistingEquipment.map((row) => (
          <li key={row.key}>
            <button type="button" class="pick" onClick={() => add(existingFromTypical(row))} disabled={busy} data-testid={`pick-${row.key}`}>
              <span class="pick-title">{row.label}</span>
              <span class="pick-line">{row.fixtureInputWatts} W per fixture</span>
            </button>
          </li>
        ))}
        <li>
          <button type="button" class="pick pick--other" onClick={() => setCustom(!custom)} aria-expanded={custom}>
            <span class="pick-title">Something else</span>
            <span class="pick-line">Type the lamps and watts</span>
          </button>
        </li>
      </ul>
      {custom && <CustomFixture onAdd={add} locale={props.survey.locale} />}
    </div>
  );
}
