/**
 * Adding a room: its name, what kind of space it is and its size — the
 * figures light level and power density are judged on. Nothing is stored
 * until the room is added.
 */
import { useState } from 'preact/hooks';
import { spaceFacts } from '../../calc/spaces.ts';
import { fromDisplay } from '../../calc/units.ts';
import type { SpaceType, Survey } from '../../survey/model.ts';
import { go } from '../router.ts';
import { likelySpace, newRoomFields } from '../state/defaults.ts';
import type { SurveySession } from '../state/session.ts';
import { NumberField, SelectField, TextField } from './fields.tsx';
import { AddForm } from './AddForm.tsx';

export const spaceOptions = (Object.keys(spaceFacts) as SpaceType[]).map((value) => ({ value, label: spaceFacts[value].label }));

/**
 * The "add a room" button and, once pressed, its form.
 *
 * @example <AddRoom session={session} survey={survey} /> //=> a button; the form adds the room and opens it
 */
export function AddRoom(props: { session: SurveySession; survey: Survey }) {
  const { survey, session } = props;
  const units = survey.units;
  const lengthUnit = units === 'si' ? 'm' : 'ft';
  const maxLength = units === 'si' ? 1000 : 3280;
  const [name, setName] = useState(`Room ${survey.rooms.length + 1}`);
  const [space, setSpace] = useState<SpaceType>(likelySpace(survey.buildingType));
  const [length, setLength] = useState<number | undefined>(undefined);
  const [width, setWidth] = useState<number | undefined>(undefined);
  const [ceiling, setCeiling] = useState<number | undefined>(undefined);
  const ready = length !== undefined && width !== undefined && ceiling !== undefined && name.trim() !== '';

  const add = async () => {
    if (length === undefined || width === undefined || ceiling === undefined) return;
    const room = await session.addRoom(
      newRoomFields(survey.buildingType, {
        name: name.trim(),
        spaceType: space,
        floor: { kind: 'rectangle', lengthMetres: fromDisplay('length', length, units), widthMetres: fromDisplay('length', width, units) },
        ceilingHeightMetres: fromDisplay('length', ceiling, units),
      }),
    );
    go({ name: 'room', surveyId: survey.id, roomId: room.id });
  };

  return (
    <AddForm
      openLabel="Add a room"
      openTestId="add-room"
      formLabel="New room"
      submitLabel="Add the room"
      submitTestId="new-room-add"
      ready={ready}
      onAdd={add}
      notReadyHint={<p class="quiet">Enter the length, width and ceiling height to add the room.</p>}
    >
      <TextField label="Room name" value={name} onChange={setName} testId="new-room-name" />
      <SelectField label="Space type" value={space} options={spaceOptions} onChange={setSpace} testId="new-room-space" />
      <NumberField label="Length" unit={lengthUnit} value={length} rule={{ min: 0, max: maxLength, minExclusive: true }} locale={survey.locale} onChange={setLength} testId="new-room-length" />
      <NumberField label="Width" unit={lengthUnit} value={width} rule={{ min: 0, max: maxLength, minExclusive: true }} locale={survey.locale} onChange={setWidth} testId="new-room-width" />
      <NumberField label="Ceiling height" unit={lengthUnit} value={ceiling} rule={{ min: 0, max: units === 'si' ? 100 : 328, minExclusive: true }} locale={survey.locale} onChange={setCeiling} testId="new-room-ceiling" />
    </AddForm>
  );
}
