/**
 * One fixture entry: how many, what is there, where it is, what it becomes,
 * with the live figures and warnings beside it. Every change saves at once;
 * delete can be undone.
 */
import type { FixtureEntry, Room } from '../../survey/model.ts';
import { ConditionsEditor } from '../components/ConditionsEditor.tsx';
import { ExistingEditor } from '../components/ExistingEditor.tsx';
import { NumberField, SelectField, Stepper, TextField } from '../components/fields.tsx';
import { Section } from '../components/Section.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { LiveFigures, LiveWarnings } from '../components/LivePanel.tsx';
import { PhotoStrip } from '../components/PhotoStrip.tsx';
import { ProposalPicker } from '../components/ProposalPicker.tsx';
import { SaveStatus } from '../components/SaveStatus.tsx';
import { go, href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { uiFigures } from '../state/format.ts';
import { controlLabels, optionsOf } from '../state/labels.ts';
import type { SessionSnapshot, SurveySession } from '../state/session.ts';
import { useCatalog } from '../state/useSession.ts';

function DeleteEntry(props: { session: SurveySession; entry: FixtureEntry; room: Room; surveyId: string }) {
  const { notify } = useApp();
  const { session, entry, room, surveyId } = props;
  const remove = async () => {
    try {
      const trashId = await session.deleteEntry(entry.id);
      go({ name: 'room', surveyId, roomId: room.id }, true);
      notify({
        tone: 'info',
        text: `Deleted ${entry.count} × ${entry.existing.description || 'fixture'}.`,
        action: { label: 'Undo', run: () => session.restore(trashId) },
      });
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    }
  };
  return (
    <button type="button" class="button button--danger" onClick={remove} data-testid="delete-entry">
      <Icon name="trash" />
      Delete this entry
    </button>
  );
}

/**
 * The fixture entry editor.
 *
 * @example <EntryScreen session={session} snapshot={snapshot} room={room} roomIndex={0} entry={entry} entryIndex={0} /> //=> count, live figures, swap to, conditions…
 */
export function EntryScreen(props: { session: SurveySession; snapshot: SessionSnapshot; room: Room; roomIndex: number; entry: FixtureEntry; entryIndex: number }) {
  const { store } = useApp();
  const { session, snapshot, room, entry } = props;
  const { survey } = snapshot;
  const fig = uiFigures(survey);
  const { catalog } = useCatalog(store);
  const result = snapshot.result?.rooms[props.roomIndex]?.entries[props.entryIndex];
  const roomRoute = { name: 'room', surveyId: survey.id, roomId: room.id } as const;
  return (
    <Screen
      title={entry.existing.description || 'Fixture'}
      section="surveys"
      back={{ route: roomRoute, label: room.name || 'Room' }}
      aside={<SaveStatus status={snapshot.status} />}
      class="entry-screen"
    >
      {snapshot.calcError && (
        <p class="panel panel--alert" role="alert">
          The figures cannot be worked out: {snapshot.calcError}
        </p>
      )}
      <div class="entry-layout">
        <div class="entry-count">
          <Section title="How many">
            <Stepper label="Fixtures" value={entry.count} min={0} max={100_000} locale={survey.locale} onChange={(count) => session.updateEntry(entry.id, { count })} large testId="entry-count" />
          </Section>
        </div>
        <div class="entry-side">
          <div class="entry-figures">
            {result ? (
              <section class="panel panel--live" aria-labelledby="live-heading">
                <h2 id="live-heading">Live figures</h2>
                <LiveFigures result={result} fig={fig} />
              </section>
            ) : (
              <p class="panel">No figures until the values below are fixed.</p>
            )}
          </div>
          <div class="entry-warnings">
            {result && (
              <section class="panel" aria-labelledby="watch-heading">
                <h2 id="watch-heading">Watch out for</h2>
                <LiveWarnings result={result} />
              </section>
            )}
          </div>
        </div>
        <div class="entry-swap">
          <Section title="Swap to">
            <ProposalPicker session={session} survey={survey} room={room} entry={entry} catalog={catalog} fig={fig} />
          </Section>
        </div>
        <div class="entry-rest">
          <Section title="Where it is">
            <ConditionsEditor session={session} entry={entry} locale={survey.locale} />
          </Section>
          <Section title="What is there now">
            <ExistingEditor session={session} entry={entry} result={result} locale={survey.locale} currency={survey.money.currency} fig={fig} />
          </Section>
          <Section title="Controls">
            <div class="grid-fields">
              <SelectField label="Control added with the swap" value={entry.control} options={optionsOf(controlLabels)} onChange={(control) => session.updateEntry(entry.id, { control })} />
              <NumberField
                label="Share of hours the control saves"
                unit="%"
                value={entry.controlSavingsFraction === undefined ? undefined : Math.round(entry.controlSavingsFraction * 1000) / 10}
                rule={{ min: 0, max: 90, optional: true }}
                locale={survey.locale}
                onChange={(value) => session.updateEntry(entry.id, { controlSavingsFraction: value === undefined ? undefined : value / 100 })}
                hint={result ? `Leave empty for ${fig.percent(result.controlSavingsFraction, 0)} (ASHRAE/IES 90.1-2019 Table G3.7 for sensors).` : undefined}
              />
            </div>
          </Section>
          <Section title="Photos and notes">
            <PhotoStrip ownerKind="entry" ownerId={entry.id} label={entry.existing.description || 'this fixture'} />
            <TextField label="Notes" value={entry.notes} onChange={(notes) => session.updateEntry(entry.id, { notes })} multiline />
          </Section>
          <div class="actions">
            <a class="button" href={href(roomRoute)} data-testid="entry-done">
              <Icon name="check" />
              Done: back to {room.name || 'the room'}
            </a>
            <DeleteEntry session={session} entry={entry} room={room} surveyId={survey.id} />
          </div>
        </div>
      </div>
    </Screen>
  );
}
