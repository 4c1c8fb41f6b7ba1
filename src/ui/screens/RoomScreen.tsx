/**
 * One room: its fixtures (add, repeat, adjust), whether the new light is
 * enough and within the allowance, every warning in the room, its size and
 * hours, controls, photos, and copy or delete.
 */
import { useState } from 'preact/hooks';
import type { RoomResult } from '../../calc/survey.ts';
import type { Room, Survey } from '../../survey/model.ts';
import { Adequacy } from '../components/Adequacy.tsx';
import { EntryList } from '../components/EntryList.tsx';
import { NumberField, SelectField } from '../components/fields.tsx';
import { Section } from '../components/Section.tsx';
import { HoursEditor } from '../components/HoursEditor.tsx';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { PhotoStrip } from '../components/PhotoStrip.tsx';
import { QuickAdd, likelyVolts } from '../components/QuickAdd.tsx';
import { RoomForm } from '../components/RoomForm.tsx';
import { SaveStatus } from '../components/SaveStatus.tsx';
import { ScheduleImport } from '../components/ScheduleImport.tsx';
import { WarningBadges, WarningList } from '../components/Warnings.tsx';
import { go } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { uiFigures, type UiFigures } from '../state/format.ts';
import { controlLabels, optionsOf } from '../state/labels.ts';
import type { SessionSnapshot, SurveySession } from '../state/session.ts';
import { useCatalog } from '../state/useSession.ts';

function RoomFigures(props: { result: RoomResult; fig: UiFigures }) {
  const { result, fig } = props;
  return (
    <dl class="strip" data-testid="room-figures">
      <div>
        <dt>Saves</dt>
        <dd>{fig.kwhPerYear(result.savings.kwhPerYear)}</dd>
      </div>
      <div>
        <dt>Money</dt>
        <dd>{fig.money(result.money.totalPerYear)}/yr</dd>
      </div>
      <div>
        <dt>Fixtures</dt>
        <dd>{fig.number(result.fixtures)}</dd>
      </div>
      <div>
        <dt>Warnings</dt>
        <dd>
          <WarningBadges counts={result.warningCounts} />
          {result.warningCounts.danger + result.warningCounts.caution + result.warningCounts.advice === 0 && 'none'}
        </dd>
      </div>
    </dl>
  );
}

function Controls(props: { session: SurveySession; room: Room }) {
  if (props.room.entries.length === 0) return <p class="quiet">Log fixtures first; each can get its own control.</p>;
  return (
    <div class="grid-fields">
      {props.room.entries.map((entry) => (
        <SelectField
          key={entry.id}
          label={`${entry.count} × ${entry.existing.description || 'fixture'}`}
          value={entry.control}
          options={optionsOf(controlLabels)}
          onChange={(control) => props.session.updateEntry(entry.id, { control })}
        />
      ))}
    </div>
  );
}

function RoomActions(props: { session: SurveySession; survey: Survey; room: Room }) {
  const { notify } = useApp();
  const { session, survey, room } = props;
  const [units, setUnits] = useState<number | undefined>(undefined);
  const [busy, setBusy] = useState(false);
  const act = async (work: () => Promise<void>) => {
    setBusy(true);
    try {
      await work();
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    } finally {
      setBusy(false);
    }
  };
  return (
    <div class="room-actions">
      <div class="actions">
        <button
          type="button"
          class="button"
          disabled={busy}
          onClick={() =>
            act(async () => {
              const copy = await session.duplicateRoom(room.id);
              go({ name: 'room', surveyId: survey.id, roomId: copy.id });
            })
          }
        >
          <Icon name="copy" />
          Duplicate this room
        </button>
      </div>
      <form
        class="inline-form"
        onSubmit={(event) => {
          event.preventDefault();
          if (units === undefined) return;
          void act(async () => {
            const copies = await session.copyRoomToUnits(room.id, units);
            notify({ tone: 'info', text: `Copied to ${copies.length} units, each with its fixtures.` });
          });
        }}
      >
        <NumberField label="Identical units to copy it to" value={units} rule={{ min: 1, max: 500, integer: true, optional: true }} locale={survey.locale} onChange={setUnits} />
        <button type="submit" class="button" disabled={busy || units === undefined}>
          Copy
        </button>
      </form>
      <button
        type="button"
        class="button button--danger"
        disabled={busy}
        onClick={() =>
          act(async () => {
            const trashId = await session.deleteRoom(room.id);
            go({ name: 'survey', surveyId: survey.id });
            notify({
              tone: 'info',
              text: `“${room.name}” deleted with its fixtures and photos.`,
              action: {
                label: 'Undo',
                run: async () => {
                  await session.restore(trashId);
                  go({ name: 'room', surveyId: survey.id, roomId: room.id });
                },
              },
            });
          })
        }
        data-testid="delete-room"
      >
        <Icon name="trash" />
        Delete this room
      </button>
    </div>
  );
}

/**
 * The room screen.
 *
 * @example <RoomScreen session={session} snapshot={snapshot} room={room} index={0} /> //=> fixtures, light, warnings, size and hours
 */
export function RoomScreen(props: { session: SurveySession; snapshot: SessionSnapshot; room: Room; index: number }) {
  const { store, preferences } = useApp();
  const { session, snapshot, room } = props;
  const { survey } = snapshot;
  const result = snapshot.result?.rooms[props.index] ?? null;
  const fig = uiFigures(survey);
  const { catalog } = useCatalog(store);
  const warnings = result ? [...result.entries.flatMap((entry) => entry.warnings), ...result.warnings] : [];
  return (
    <Screen
      title={room.name || 'Unnamed room'}
      section="surveys"
      back={{ route: { name: 'survey', surveyId: survey.id }, label: survey.name || 'Survey' }}
      subtitle={result?.spaceLabel}
      aside={<SaveStatus status={snapshot.status} />}
      class="room-screen"
    >
      {snapshot.calcError && (
        <p class="panel panel--alert" role="alert">
          The figures cannot be worked out: {snapshot.calcError}
        </p>
      )}
      {result && <RoomFigures result={result} fig={fig} />}
      <div class="overview">
        <div class="overview-main">
          <Section title="Fixtures">
            <EntryList session={session} survey={survey} room={room} results={result?.entries ?? null} lastEntryId={snapshot.lastEntryId} fig={fig}>
              <QuickAdd session={session} survey={survey} roomId={room.id} />
            </EntryList>
            <ScheduleImport session={session} roomId={room.id} catalog={catalog ?? []} volts={likelyVolts(survey, preferences.circuitVolts)} />
          </Section>
          <Section title="Warnings in this room">
            <WarningList warnings={warnings} empty="Nothing to watch here so far." testId="room-warnings" />
          </Section>
        </div>
        <div class="overview-side">
          {result && (
            <Section title="Enough light?">
              <Adequacy room={result} fig={fig} />
            </Section>
          )}
          <Section title="Photos of the room">
            <PhotoStrip ownerKind="room" ownerId={room.id} label={room.name || 'the room'} />
          </Section>
        </div>
      </div>
      <Section title="Size and hours">
        <RoomForm session={session} survey={survey} room={room} fig={fig} />
        <HoursEditor session={session} room={room} locale={survey.locale} fig={fig} />
      </Section>
      <Section title="Controls">
        <Controls session={session} room={room} />
      </Section>
      <Section title="Copy or delete">
        <RoomActions session={session} survey={survey} room={room} />
      </Section>
    </Screen>
  );
}
