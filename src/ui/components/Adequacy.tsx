/**
 * Is the new light enough, and within the code allowance? Light level by the
 * lumen method against the space's recommended level, and power density
 * against its allowance, in the survey's units.
 */
import type { RoomResult } from '../../calc/survey.ts';
import { warningThresholds } from '../../calc/warnings.ts';
import type { UiFigures } from '../state/format.ts';

function Meter(props: { label: string; value: number | null; target: number; text: string; good: 'near' | 'below' }) {
  const ratio = props.value === null ? null : props.value / (props.target || 1);
  const width = ratio === null ? 0 : Math.min(100, (ratio / 2) * 100);
  let state = 'unknown';
  if (ratio !== null) {
    if (props.good === 'below') state = ratio <= 1 ? 'ok' : 'over';
    else state = ratio < warningThresholds.illuminanceShortFraction ? 'short' : ratio > warningThresholds.illuminanceOverFraction ? 'over' : 'ok';
  }
  return (
    <div class={`meter meter--${state}`}>
      <span class="meter-label">{props.label}</span>
      <span class="meter-track" aria-hidden="true">
        <span class="meter-fill" style={{ width: `${width}%` }} />
        <span class="meter-target" />
      </span>
      <span class="meter-value">{props.text}</span>
    </div>
  );
}

const verdicts: Record<string, string> = {
  ok: 'within range',
  short: 'short of the target',
  over: 'well above the target',
  unknown: 'not estimated',
};

/**
 * Light level and power density of one room against their targets.
 *
 * @example <Adequacy room={result.rooms[0]} fig={fig} /> //=> two meters each for light and W/ft² (or lx, W/m²)
 */
export function Adequacy(props: { room: RoomResult; fig: UiFigures }) {
  const { fig } = props;
  const a = props.room.adequacy;
  const lux = (value: number | null) => (value === null ? 'not estimated (lumens unknown)' : fig.quantity('illuminance', value));
  const lightState = (value: number | null) => {
    if (value === null) return verdicts.unknown;
    const ratio = value / a.targetLux;
    return ratio < warningThresholds.illuminanceShortFraction ? verdicts.short : ratio > warningThresholds.illuminanceOverFraction ? verdicts.over : verdicts.ok;
  };
  return (
    <div class="adequacy" data-testid="adequacy">
      <h3>Light level</h3>
      <p class="quiet">Recommended for this space: {fig.quantity('illuminance', a.targetLux)}.</p>
      <Meter label="Now" value={a.existingLux} target={a.targetLux} text={`${lux(a.existingLux)} — ${lightState(a.existingLux)}`} good="near" />
      <Meter label="After" value={a.proposedLux} target={a.targetLux} text={`${lux(a.proposedLux)} — ${lightState(a.proposedLux)}`} good="near" />
      <h3>Power density</h3>
      <p class="quiet">Allowance (ASHRAE/IES 90.1-2019 space by space): {fig.quantity('powerDensity', a.allowanceWattsPerSquareMetre)}.</p>
      <Meter label="Now" value={a.existingWattsPerSquareMetre} target={a.allowanceWattsPerSquareMetre} text={`${fig.quantity('powerDensity', a.existingWattsPerSquareMetre)}`} good="below" />
      <Meter
        label="After"
        value={a.proposedWattsPerSquareMetre}
        target={a.allowanceWattsPerSquareMetre}
        text={`${fig.quantity('powerDensity', a.proposedWattsPerSquareMetre)} — ${a.proposedWithinAllowance ? 'within the allowance' : 'over the allowance'}`}
        good="below"
      />
      <details>
        <summary>How this is worked out</summary>
        <ul class="plain-list quiet">
          <li>
            Floor {fig.quantity('area', a.floorSquareMetres)}, room cavity ratio {fig.number(a.roomCavityRatio, 2)}, coefficient of utilisation {fig.number(a.coefficientOfUtilisation, 2)} ({a.cuSource}).
          </li>
          {a.notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      </details>
    </div>
  );
}
