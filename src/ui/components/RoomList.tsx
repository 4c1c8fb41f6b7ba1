/** The rooms of a survey with what each saves and its warning counts. */
import type { RoomResult } from '../../calc/survey.ts';
import type { Survey } from '../../survey/model.ts';
import { href } from '../router.ts';
import { useApp } from '../state/context.ts';
import type { UiFigures } from '../state/format.ts';
import { Icon } from './Icon.tsx';
import { Thumb } from './Thumb.tsx';
import { WarningBadges } from './Warnings.tsx';

/**
 * The rooms of a survey with savings and warning badges.
 *
 * @example <RoomList survey={survey} results={result.rooms} fig={fig} /> //=> one row per room
 */
export function RoomList(props: { survey: Survey; results: readonly RoomResult[] | null; fig: UiFigures }) {
  const { store } = useApp();
  const { survey, results, fig } = props;
  if (survey.rooms.length === 0) return <p>No rooms yet. Add the first room you walk into.</p>;
  return (
    <ul class="rows" data-testid="room-list">
      {survey.rooms.map((room, index) => {
        const result = results?.[index];
        const fixtures = room.entries.reduce((sum, entry) => sum + entry.count, 0);
        return (
          <li key={room.id}>
            <a class="row row--link" href={href({ name: 'room', surveyId: survey.id, roomId: room.id })} data-testid="room-row">
              <Thumb store={store} ownerId={room.id} alt="" />
              <span class="row-main">
                <span class="row-title">{room.name || 'Unnamed room'}</span>
                <span class="row-line">
                  {result?.spaceLabel ?? room.spaceType} · {fixtures} fixture{fixtures === 1 ? '' : 's'}
                </span>
                {result && (
                  <span class="row-figures row-figures--inline">
                    <span>{fig.kwhPerYear(result.savings.kwhPerYear)}</span>
                    <span>{fig.money(result.money.totalPerYear)}/yr</span>
                    <WarningBadges counts={result.warningCounts} />
                  </span>
                )}
              </span>
              <Icon name="next" />
            </a>
          </li>
        );
      })}
    </ul>
  );
}
