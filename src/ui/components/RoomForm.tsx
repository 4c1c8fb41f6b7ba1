/** A room's space type, size, light-design factors and notes. */
import { ansiNominalCct, cctBandKelvin } from '../../calc/choice.ts';
import { fromDisplay, toDisplay } from '../../calc/units.ts';
import type { Room, Survey } from '../../survey/model.ts';
import { changeFields } from '../../survey/store.ts';
import type { UiFigures } from '../state/format.ts';
import type { SurveySession } from '../state/session.ts';
import { spaceOptions } from './AddRoom.tsx';
import { Choice, NumberField, SelectField, TextField, Toggle } from './fields.tsx';

/**
 * The choices for a room's preferred colour temperature: no preference, or
 * one of the ANSI C78.377 nominal CCTs with the band automatic product choice
 * keeps to (`cctBandKelvin`). A value that is not a nominal one (from an
 * imported file) is kept as its own choice so the select still shows it.
 *
 * @example cctOptions(undefined)[2] //=> { value: '3000', label: '3000 K (2870–3220 K)' }
 */
export function cctOptions(current: number | undefined): { value: string; label: string }[] {
  const nominal = ansiNominalCct.map((bin) => bin.nominalKelvin);
  const shown = current !== undefined && !nominal.includes(current) ? [...nominal, current].sort((a, b) => a - b) : nominal;
  return [
    { value: '', label: 'No preference' },
    ...shown.map((kelvin) => {
      const band = cctBandKelvin(kelvin);
      return { value: String(kelvin), label: `${kelvin} K (${Math.round(band.minKelvin)}–${Math.round(band.maxKelvin)} K)` };
    }),
  ];
}

/**
 * A room's space type, size, light-design factors and notes.
 *
 * @example <RoomForm session={session} survey={survey} room={room} fig={fig} /> //=> the room fields in the survey's units
 */
export function RoomForm(props: { session: SurveySession; survey: Survey; room: Room; fig: UiFigures }) {
  const { session, survey, room, fig } = props;
  const units = survey.units;
  const lengthUnit = fig.unit('length');
  const show = (metres: number) => toDisplay('length', metres, units);
  const store = (value: number) => fromDisplay('length', value, units);
  const maxLength = units === 'si' ? 1000 : 3280;
  const floor = room.floor;
  const update = (patch: Parameters<SurveySession['updateRoom']>[1]) => session.updateRoom(room.id, patch);
  const needed = (apply: (value: number) => string | null) => (value: number | undefined) => (value === undefined ? 'Enter a number.' : apply(value));
  // Only the field changed is saved (another window may change the others).
  const photometry = (key: keyof Room['photometry']) => (value: number | undefined) => update({ photometry: changeFields<Room['photometry']>({ [key]: value }) });
  type Rectangle = Extract<Room['floor'], { kind: 'rectangle' }>;
  return (
    <div class="grid-fields">
      <TextField label="Room name" value={room.name} onChange={(name) => update({ name })} testId="room-name" />
      <SelectField label="Space type" value={room.spaceType} options={spaceOptions} onChange={(spaceType) => update({ spaceType })} testId="room-space" />
      <Choice
        legend="Floor"
        name={`floor-${room.id}`}
        value={floor.kind}
        options={[
          { value: 'rectangle', label: 'Length × width' },
          { value: 'area', label: 'Area only' },
        ]}
        onChange={(kind) => {
          if (kind === floor.kind) return null;
          if (kind === 'area') return update({ floor: { kind: 'area', squareMetres: floor.kind === 'rectangle' ? floor.lengthMetres * floor.widthMetres : 1 } });
          const side = floor.kind === 'area' ? Math.sqrt(floor.squareMetres) : 1;
          return update({ floor: { kind: 'rectangle', lengthMetres: side, widthMetres: side } });
        }}
      />
      {floor.kind === 'rectangle' ? (
        <>
          <NumberField label="Length" unit={lengthUnit} value={show(floor.lengthMetres)} rule={{ min: 0, max: maxLength, minExclusive: true }} locale={survey.locale} digits={2} onChange={needed((value) => update({ floor: changeFields<Rectangle>({ kind: 'rectangle', lengthMetres: store(value) }) }))} testId="room-length" />
          <NumberField label="Width" unit={lengthUnit} value={show(floor.widthMetres)} rule={{ min: 0, max: maxLength, minExclusive: true }} locale={survey.locale} digits={2} onChange={needed((value) => update({ floor: changeFields<Rectangle>({ kind: 'rectangle', widthMetres: store(value) }) }))} testId="room-width" />
        </>
      ) : (
        <NumberField
          label="Floor area"
          unit={fig.unit('area')}
          value={toDisplay('area', floor.squareMetres, units)}
          rule={{ min: 0, max: units === 'si' ? 1e6 : 1.07e7, minExclusive: true }}
          locale={survey.locale}
          digits={1}
          onChange={needed((value) => update({ floor: { kind: 'area', squareMetres: fromDisplay('area', value, units) } }))}
        />
      )}
      <NumberField
        label="Ceiling height"
        unit={lengthUnit}
        value={show(room.ceilingHeightMetres)}
        rule={{ min: 0, max: units === 'si' ? 100 : 328, minExclusive: true }}
        locale={survey.locale}
        digits={2}
        onChange={needed((value) => (store(value) <= room.workPlaneHeightMetres ? 'Must be above the work plane.' : update({ ceilingHeightMetres: store(value) })))}
        testId="room-ceiling"
      />
      <NumberField
        label="Work plane height"
        unit={lengthUnit}
        value={show(room.workPlaneHeightMetres)}
        rule={{ min: 0, max: units === 'si' ? 100 : 328 }}
        locale={survey.locale}
        digits={2}
        hint="Desk height for offices; 0 where the floor is the task."
        onChange={needed((value) => (store(value) >= room.ceilingHeightMetres ? 'Must be below the ceiling.' : update({ workPlaneHeightMetres: store(value) })))}
      />
      <Toggle label="Colour matters here (display, art, clinical)" checked={room.colourCritical} onChange={(colourCritical) => update({ colourCritical })} />
      <SelectField
        label="Preferred colour temperature"
        value={room.preferredCctKelvin === undefined ? '' : String(room.preferredCctKelvin)}
        options={cctOptions(room.preferredCctKelvin)}
        // Only this field is saved; "No preference" removes it (undefined removes a field in a patch).
        onChange={(chosen) => update({ preferredCctKelvin: chosen === '' ? undefined : Number(chosen) })}
        hint="Product suggestions keep to the ANSI C78.377 band shown in brackets."
        testId="room-cct"
      />
      <NumberField label="Coefficient of utilisation" value={room.photometry.coefficientOfUtilisation} rule={{ min: 0.01, max: 1.5, optional: true }} locale={survey.locale} onChange={photometry('coefficientOfUtilisation')} hint="Leave empty to use the table for each fixture's distribution." />
      <NumberField label="Light loss factor" value={room.photometry.lightLossFactor} rule={{ min: 0.01, max: 1.5, optional: true }} locale={survey.locale} onChange={photometry('lightLossFactor')} hint="Leave empty to build it from lamp and dirt depreciation." />
      <TextField label="Notes" value={room.notes} onChange={(notes) => update({ notes })} multiline class="field--wide" />
    </div>
  );
}
