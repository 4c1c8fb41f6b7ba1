/**
 * The screens of one survey (overview, room, fixture entry), loaded when a
 * survey is first opened. They share one session, so moving between them
 * keeps the calculated results and the autosave queue.
 */
import { Screen } from '../components/Layout.tsx';
import type { Route } from '../router.ts';
import { useApp } from '../state/context.ts';
import { useSurveySession } from '../state/useSession.ts';
import { EntryScreen } from './EntryScreen.tsx';
import { RoomScreen } from './RoomScreen.tsx';
import { SuggestScreen } from './SuggestScreen.tsx';
import { SurveyScreen } from './SurveyScreen.tsx';

export type SurveyRoute = Extract<Route, { name: 'survey' | 'room' | 'entry' | 'suggest' }>;

function Missing(props: { title: string; text: string; back: Route; backLabel: string }) {
  return (
    <Screen title={props.title} section="surveys" back={{ route: props.back, label: props.backLabel }}>
      <p role="alert">{props.text}</p>
    </Screen>
  );
}

/**
 * The screens of one survey, sharing one session.
 *
 * @example <SurveyArea route={{ name: 'survey', surveyId: 'demo-tallowmere' }} /> //=> the overview once the survey is open
 */
export function SurveyArea(props: { route: SurveyRoute }) {
  const { store } = useApp();
  const { route } = props;
  const { session, snapshot, error } = useSurveySession(store, route.surveyId);
  if (error) return <Missing title="Survey not found" text={error} back={{ name: 'surveys' }} backLabel="Surveys" />;
  if (!session || !snapshot) {
    return (
      <Screen title="" section="surveys">
        <p role="status">Opening the survey…</p>
      </Screen>
    );
  }
  if (route.name === 'survey') return <SurveyScreen session={session} snapshot={snapshot} />;
  if (route.name === 'suggest') return <SuggestScreen session={session} snapshot={snapshot} />;
  const roomIndex = snapshot.survey.rooms.findIndex((room) => room.id === route.roomId);
  const room = snapshot.survey.rooms[roomIndex];
  const back: Route = { name: 'survey', surveyId: route.surveyId };
  if (!room) return <Missing title="Room not found" text="This room is not in the survey any more (it may have been deleted)." back={back} backLabel={snapshot.survey.name || 'Survey'} />;
  if (route.name === 'room') return <RoomScreen session={session} snapshot={snapshot} room={room} index={roomIndex} />;
  const entryIndex = room.entries.findIndex((entry) => entry.id === route.entryId);
  const entry = room.entries[entryIndex];
  if (!entry) {
    return (
      <Missing
        title="Fixture not found"
        text="This fixture entry is not in the room any more (it may have been deleted)."
        back={{ name: 'room', surveyId: route.surveyId, roomId: room.id }}
        backLabel={room.name || 'Room'}
      />
    );
  }
  return <EntryScreen session={session} snapshot={snapshot} room={room} roomIndex={roomIndex} entry={entry} entryIndex={entryIndex} />;
}
