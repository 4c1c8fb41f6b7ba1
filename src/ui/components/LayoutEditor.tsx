/**
 * Repeated layouts on the survey overview: "this survey is one typical unit"
 * standing for N units built the same way, and the units that differ (one
 * flat already converted, one with an extra fitting). Every change is checked
 * where it is typed (whole units 1–10,000, no more differing units than
 * units) and saved through the survey's autosave queue; turning the layout
 * off can be undone from the notice.
 */
import { useState } from 'preact/hooks';
import type { FixtureEntry, LayoutEntryCount, LayoutException, RepeatedLayout, Survey } from '../../survey/model.ts';
import { useApp } from '../state/context.ts';
import { rules } from '../state/fields.ts';
import type { SurveySession } from '../state/session.ts';
import { NumberField, TextField, Toggle } from './fields.tsx';
import { Icon } from './Icon.tsx';

/** Most units one layout may stand for (the survey file's limit). */
export const maxLayoutUnits = 10_000;

const unitRule = { min: 1, max: maxLayoutUnits, integer: true } as const;

interface EntryLine {
  entry: FixtureEntry;
  roomName: string;
}

function entryLines(survey: Survey): EntryLine[] {
  return survey.rooms.flatMap((room) => room.entries.map((entry) => ({ entry, roomName: room.name || 'Room' })));
}

/**
 * An exception's counts without the ones equal to the surveyed count (they
 * follow the surveyed unit) and without entries no longer in the survey.
 *
 * @example tidyCounts([{ entryId: 'a', count: 4 }, { entryId: 'b', count: 0 }], new Map([['a', 4], ['b', 2]])) //=> [{ entryId: 'b', count: 0 }]
 */
export function tidyCounts(counts: readonly LayoutEntryCount[], surveyed: ReadonlyMap<string, number>): LayoutEntryCount[] {
  return counts.filter((item) => surveyed.has(item.entryId) && surveyed.get(item.entryId) !== item.count);
}

function newException(index: number): LayoutException {
  return { id: crypto.randomUUID(), unitLabel: `Unit ${index}`, entryCounts: [], notes: '' };
}

/** Entry ids the layout names that are no longer in the survey (their fixture entry was deleted). */
function staleIds(layout: RepeatedLayout, surveyed: ReadonlyMap<string, number>): number {
  return layout.exceptions.reduce((sum, unit) => sum + unit.entryCounts.filter((item) => !surveyed.has(item.entryId)).length, 0);
}

function UnitEditor(props: {
  unit: LayoutException;
  index: number;
  lines: readonly EntryLine[];
  locale: string;
  onChange: (unit: LayoutException) => string | null;
  onRemove: () => void;
}) {
  const { unit, lines } = props;
  const own = new Map(unit.entryCounts.map((item) => [item.entryId, item.count]));
  const converted = lines.length > 0 && lines.every((line) => own.get(line.entry.id) === 0);
  const setCount = (entryId: string, count: number) => {
    const rest = unit.entryCounts.filter((item) => item.entryId !== entryId);
    return props.onChange({ ...unit, entryCounts: [...rest, { entryId, count }] });
  };
  const headingId = `layout-unit-${unit.id}`;
  return (
    <li class="subpanel layout-unit" data-testid="layout-unit">
      <h4 id={headingId}>
        {unit.unitLabel.trim() || `Differing unit ${props.index + 1}`}
        {converted && <span class="tag tag--advice">already converted</span>}
      </h4>
      <TextField label="Which unit" value={unit.unitLabel} onChange={(unitLabel) => props.onChange({ ...unit, unitLabel })} hint="As the landlord names it, e.g. Flat 3B." testId="layout-unit-label" />
      <div class="actions">
        <button
          type="button"
          class="button"
          onClick={() => props.onChange({ ...unit, entryCounts: lines.map((line) => ({ entryId: line.entry.id, count: 0 })) })}
          disabled={lines.length === 0 || converted}
          data-testid="layout-unit-converted"
        >
          <Icon name="check" />
          Already converted (all counts 0)
        </button>
        <button type="button" class="button button--quiet" onClick={() => props.onChange({ ...unit, entryCounts: [] })} disabled={unit.entryCounts.length === 0}>
          <Icon name="undo" />
          Same as the surveyed unit
        </button>
      </div>
      {lines.length === 0 ? (
        <p class="quiet">Add fixtures to the surveyed unit first; then record here how this unit differs.</p>
      ) : (
        <fieldset class="layout-counts">
          <legend>Fixtures in this unit (the surveyed unit's count unless changed)</legend>
          <div class="grid-fields">
            {lines.map((line) => (
              <NumberField
                key={line.entry.id}
                label={`${line.roomName}: ${line.entry.existing.description || 'fixture'}`}
                value={own.get(line.entry.id) ?? line.entry.count}
                rule={rules.count}
                locale={props.locale}
                onChange={(count) => (count === undefined ? 'Enter a number (0 when this unit needs none).' : setCount(line.entry.id, count))}
                hint={own.has(line.entry.id) ? `Surveyed unit: ${line.entry.count}` : undefined}
                testId="layout-unit-count"
              />
            ))}
          </div>
        </fieldset>
      )}
      <TextField label="Notes on this unit" value={unit.notes} onChange={(notes) => props.onChange({ ...unit, notes })} multiline />
      <button type="button" class="button button--quiet" onClick={props.onRemove} data-testid="layout-unit-remove">
        <Icon name="trash" />
        Remove this differing unit
      </button>
    </li>
  );
}

/**
 * The repeated-layout settings of a survey.
 *
 * @example <LayoutEditor session={session} survey={survey} /> //=> a switch; when on, the unit count and the units that differ
 */
export function LayoutEditor(props: { session: SurveySession; survey: Survey }) {
  const { preferences, notify } = useApp();
  const { session, survey } = props;
  const layout = survey.layout;
  const lines = entryLines(survey);
  const surveyed = new Map(lines.map((line) => [line.entry.id, line.entry.count]));
  const [countMessage, setCountMessage] = useState<string | null>(null);

  const save = (next: RepeatedLayout | undefined): string | null => session.updateSurvey({ layout: next });

  const toggle = (on: boolean) => {
    if (on) return save(layout ?? { unitCount: 1, exceptions: [] });
    if (!layout) return null;
    const previous = layout;
    const refused = save(undefined);
    if (refused) return refused;
    notify({
      tone: 'info',
      text: `This survey is a single building again (it stood for ${previous.unitCount} units${previous.exceptions.length > 0 ? `, ${previous.exceptions.length} differing` : ''}).`,
      action: {
        label: 'Undo',
        run: () => {
          const again = save(previous);
          if (again) notify({ tone: 'error', text: again });
        },
      },
    });
    return null;
  };

  const setUnit = (index: number, unit: LayoutException): string | null => {
    if (!layout) return null;
    const exceptions = layout.exceptions.map((item, at) => (at === index ? { ...unit, entryCounts: tidyCounts(unit.entryCounts, surveyed) } : item));
    return save({ ...layout, exceptions });
  };

  const addUnit = () => {
    if (!layout) return;
    if (layout.exceptions.length >= layout.unitCount) {
      setCountMessage(`All ${layout.unitCount} units are already listed as differing. Raise the unit count first.`);
      return;
    }
    const refused = save({ ...layout, exceptions: [...layout.exceptions, newException(layout.exceptions.length + 1)] });
    setCountMessage(refused);
  };

  const removeUnit = (index: number) => {
    if (!layout) return;
    const removed = layout.exceptions[index];
    const refused = save({ ...layout, exceptions: layout.exceptions.filter((_, at) => at !== index) });
    if (refused) {
      notify({ tone: 'error', text: refused });
      return;
    }
    if (!removed) return;
    notify({
      tone: 'info',
      text: `“${removed.unitLabel || 'Differing unit'}” removed.`,
      action: {
        label: 'Undo',
        run: () => {
          const current = session.snapshot.survey.layout;
          if (!current) return;
          const exceptions = [...current.exceptions];
          exceptions.splice(Math.min(index, exceptions.length), 0, removed);
          const again = save({ ...current, exceptions, unitCount: Math.max(current.unitCount, exceptions.length) });
          if (again) notify({ tone: 'error', text: again });
        },
      },
    });
  };

  const stale = layout ? staleIds(layout, surveyed) : 0;
  const cleanStale = () => {
    if (!layout) return;
    const refused = save({ ...layout, exceptions: layout.exceptions.map((unit) => ({ ...unit, entryCounts: tidyCounts(unit.entryCounts, surveyed) })) });
    if (refused) notify({ tone: 'error', text: refused });
  };

  return (
    <div class="layout-editor" data-testid="layout-editor">
      <Toggle
        label="This survey is one typical unit"
        checked={layout !== undefined}
        onChange={toggle}
        hint="For flats or offices built the same way: survey one, say how many share its layout, and every total, order and report counts them all."
        testId="layout-toggle"
      />
      {layout && (
        <>
          <NumberField
            label="Units with this layout"
            value={layout.unitCount}
            rule={unitRule}
            locale={preferences.locale}
            onChange={(value) => {
              if (value === undefined) return 'Enter how many units share this layout.';
              if (value < layout.exceptions.length) {
                return `${layout.exceptions.length} differing units are listed below, so there must be at least ${layout.exceptions.length} units. Remove a differing unit first.`;
              }
              const refused = save({ ...layout, unitCount: value });
              if (!refused) setCountMessage(null);
              return refused;
            }}
            hint="The surveyed unit included. Whole units, 1 to 10,000."
            class="field--short"
            testId="layout-units"
          />
          {stale > 0 && (
            <p class="nudge" role="status">
              <Icon name="rethink" size={20} />
              <span>
                {stale} recorded {stale === 1 ? 'count belongs' : 'counts belong'} to fixtures no longer in the survey, so the figures cannot be worked out.{' '}
                <button type="button" class="button button--quiet" onClick={cleanStale}>
                  Forget {stale === 1 ? 'it' : 'them'}
                </button>
              </span>
            </p>
          )}
          <h3>Units that differ ({layout.exceptions.length})</h3>
          <p class="quiet">
            Every other unit has the surveyed fixtures. List a unit here when it differs, e.g. a flat already converted (all counts 0) or one with an extra
            fitting.
          </p>
          {layout.exceptions.length > 0 && (
            <ul class="plain-list layout-units">
              {layout.exceptions.map((unit, index) => (
                <UnitEditor
                  key={unit.id}
                  unit={unit}
                  index={index}
                  lines={lines}
                  locale={preferences.locale}
                  onChange={(next) => setUnit(index, next)}
                  onRemove={() => removeUnit(index)}
                />
              ))}
            </ul>
          )}
          <div class="actions">
            <button type="button" class="button" onClick={addUnit} data-testid="layout-add-unit" disabled={layout.exceptions.length >= layout.unitCount} aria-describedby="layout-add-note">
              <Icon name="plus" />
              Add a unit that differs
            </button>
            <span id="layout-add-note" class="quiet">
              {layout.exceptions.length >= layout.unitCount ? 'Every unit is listed as differing; raise the unit count to add another.' : ''}
            </span>
          </div>
          {countMessage && (
            <p class="field-message" role="alert">
              {countMessage}
            </p>
          )}
        </>
      )}
    </div>
  );
}
