/**
 * A room's fixture entries: what is there, what it becomes, what it saves and
 * what to watch, with the count adjustable in place and the last fixture one
 * tap from being logged again.
 */
import type { ComponentChildren } from 'preact';
import type { EntryResult } from '../../calc/survey.ts';
import type { FixtureEntry, Room, Survey } from '../../survey/model.ts';
import { href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import type { UiFigures } from '../state/format.ts';
import type { SurveySession } from '../state/session.ts';
import { Stepper } from './fields.tsx';
import { Icon } from './Icon.tsx';
import { Thumb } from './Thumb.tsx';
import { WarningBadges, countWarnings } from './Warnings.tsx';

/**
 * The entry "repeat" copies: the one changed last, else the newest in this room, else the newest anywhere.
 *
 * @example repeatSource(survey, room, null)?.id //=> the id of the room's newest entry
 */
export function repeatSource(survey: Survey, room: Room, lastEntryId: string | null): FixtureEntry | null {
  if (lastEntryId) {
    for (const item of survey.rooms) {
      const found = item.entries.find((entry) => entry.id === lastEntryId);
      if (found) return found;
    }
  }
  const own = room.entries[room.entries.length - 1];
  if (own) return own;
  for (let r = survey.rooms.length - 1; r >= 0; r--) {
    const entries = survey.rooms[r]!.entries;
    const last = entries[entries.length - 1];
    if (last) return last;
  }
  return null;
}

function EntryRow(props: { session: SurveySession; survey: Survey; room: Room; entry: FixtureEntry; result: EntryResult | undefined; fig: UiFigures }) {
  const { store } = useApp();
  const { session, survey, room, entry, result, fig } = props;
  return (
    <li class="entry-row" data-testid="entry-row">
      <a class="row row--link" href={href({ name: 'entry', surveyId: survey.id, roomId: room.id, entryId: entry.id })}>
        <Thumb store={store} ownerId={entry.id} alt="" />
        <span class="row-main">
          <span class="row-title">
            {entry.count} × {entry.existing.description || 'fixture'}
          </span>
          <span class="row-line">{entry.proposed ? `→ ${entry.proposed.name}` : 'No change proposed'}</span>
          {result && (
            <span class="row-figures row-figures--inline">
              <span>{fig.kwhPerYear(result.savings.kwhPerYear)}</span>
              <span>{fig.money(result.money.totalPerYear)}/yr</span>
              <WarningBadges counts={countWarnings(result.warnings)} />
            </span>
          )}
        </span>
      </a>
      <Stepper label={`Count of ${entry.existing.description || 'fixtures'}`} value={entry.count} min={0} max={100_000} locale={survey.locale} onChange={(count) => session.updateEntry(entry.id, { count })} />
    </li>
  );
}

/**
 * A room's entries with the repeat button, the add control and a count stepper on each.
 *
 * @example <EntryList session={session} survey={survey} room={room} results={null} lastEntryId={null} fig={fig} /> //=> the list
 */
export function EntryList(props: {
  session: SurveySession;
  survey: Survey;
  room: Room;
  results: readonly EntryResult[] | null;
  lastEntryId: string | null;
  fig: UiFigures;
  /** Shown under the repeat button, above the list (the add-a-fixture control). */
  children?: ComponentChildren;
}) {
  const { notify } = useApp();
  const { session, survey, room, results, fig } = props;
  const source = repeatSource(survey, room, props.lastEntryId);

  const repeat = async () => {
    if (!source) return;
    try {
      const added = await session.repeatEntry(source.id, room.id);
      notify({
        tone: 'info',
        text: `Added again: ${added.count} × ${added.existing.description}.`,
        action: {
          label: 'Undo',
          run: async () => {
            await session.deleteEntry(added.id);
          },
        },
      });
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    }
  };

  return (
    <>
      {source && (
        <button type="button" class="button button--repeat" onClick={repeat} data-testid="repeat-last">
          <Icon name="repeat" />
          <span>
            Repeat last: <strong>{source.count} × {source.existing.description}</strong>
            {source.proposed ? ` → ${source.proposed.name}` : ''}
          </span>
        </button>
      )}
      {props.children}
      {room.entries.length === 0 ? (
        <p class="quiet">No fixtures logged in this room yet.</p>
      ) : (
        <ul class="rows" data-testid="entry-list">
          {room.entries.map((entry, index) => (
            <EntryRow key={entry.id} session={session} survey={survey} room={room} entry={entry} result={results?.[index]} fig={fig} />
          ))}
        </ul>
      )}
    </>
  );
}
