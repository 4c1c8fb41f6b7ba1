/** Hours a room's lights burn: one yearly figure, or a week by day (× weeks a year). */
import { annualHours } from '../../calc/energy.ts';
import type { HoursOfUse, Room } from '../../survey/model.ts';
import { changeFields } from '../../survey/store.ts';
import { rules } from '../state/fields.ts';
import type { UiFigures } from '../state/format.ts';
import type { SurveySession } from '../state/session.ts';
import { Choice, NumberField } from './fields.tsx';

const days = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'] as const;
const dayNames = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;

type WeeklyHours = Extract<HoursOfUse, { kind: 'weekly' }>;
type Week = WeeklyHours['days'];

/**
 * Hours of use of a room: per year or week by day.
 *
 * @example <HoursEditor session={session} room={room} locale="en-US" fig={fig} /> //=> the hours fields and the yearly total
 */
export function HoursEditor(props: { session: SurveySession; room: Room; locale: string; fig: UiFigures }) {
  const { session, room, locale, fig } = props;
  const hours = room.hours;
  const perYear = (() => {
    try {
      return annualHours(hours);
    } catch {
      return null;
    }
  })();
  const set = (next: HoursOfUse) => session.updateRoom(room.id, { hours: next });
  const switchKind = (kind: HoursOfUse['kind']) => {
    if (kind === hours.kind) return null;
    if (kind === 'annual') return set({ kind: 'annual', hoursPerYear: Math.round(perYear ?? 0) });
    const perDay = Math.min(24, Math.round(((perYear ?? 0) / (365 / 7) / 7) * 10) / 10);
    return set({ kind: 'weekly', days: [perDay, perDay, perDay, perDay, perDay, perDay, perDay] });
  };
  return (
    <div class="hours">
      <Choice
        legend="Hours the lights are on"
        name={`hours-${room.id}`}
        value={hours.kind}
        options={[
          { value: 'annual', label: 'Per year' },
          { value: 'weekly', label: 'Week by day' },
        ]}
        onChange={switchKind}
      />
      {hours.kind === 'annual' ? (
        <NumberField
          label="Hours a year"
          unit="h/yr"
          value={hours.hoursPerYear}
          rule={rules.hoursPerYear}
          locale={locale}
          onChange={(value) => (value === undefined ? 'Enter a number.' : set({ kind: 'annual', hoursPerYear: value }))}
          testId="hours-per-year"
        />
      ) : (
        <>
          <div class="week">
            {hours.days.map((value, index) => (
              <NumberField
                key={days[index]}
                label={days[index]!}
                value={value}
                rule={rules.hoursPerDay}
                locale={locale}
                class="field--day"
                hint={dayNames[index]}
                onChange={(next) => {
                  if (next === undefined) return 'Enter a number.';
                  const week = [...hours.days] as Week;
                  week[index] = next;
                  // The week only (the weeks a year may have been changed in another window).
                  return session.updateRoom(room.id, { hours: changeFields<WeeklyHours>({ kind: 'weekly', days: week }) });
                }}
              />
            ))}
          </div>
          <NumberField
            label="Weeks a year"
            value={hours.weeksPerYear}
            rule={rules.weeksPerYear}
            locale={locale}
            hint="Leave empty for a full year (52.14 weeks)."
            onChange={(weeksPerYear) => session.updateRoom(room.id, { hours: changeFields<WeeklyHours>({ kind: 'weekly', weeksPerYear }) })}
          />
        </>
      )}
      <p class="quiet" data-testid="hours-total">
        {perYear === null ? 'Check the hours above.' : `${fig.number(perYear)} hours a year.`}
      </p>
    </div>
  );
}
