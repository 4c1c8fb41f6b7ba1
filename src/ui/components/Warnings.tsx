/**
 * Warnings as the screens show them: Lampwalk's own severity names with a
 * shape as well as a colour (octagon, triangle, circle), what is wrong, and
 * what to do. Safety warnings carry the sentence deferring to local codes and
 * a licensed electrician (it is part of their action text).
 */
import type { Severity, Warning } from '../../calc/warnings.ts';
import { severityLabels } from '../state/labels.ts';
import { Icon, type IconName } from './Icon.tsx';

const severityIcons: Readonly<Record<Severity, IconName>> = { danger: 'hazard', caution: 'rethink', advice: 'note' };

/**
 * A severity as a tag: its shape and Lampwalk's word for it.
 *
 * @example <SeverityTag severity="danger" /> //=> octagon icon and "Hazard"
 */
export function SeverityTag(props: { severity: Severity }) {
  return (
    <span class={`tag tag--${props.severity}`}>
      <Icon name={severityIcons[props.severity]} size={18} />
      {severityLabels[props.severity]}
    </span>
  );
}

/**
 * Warnings with what is wrong and what to do.
 *
 * @example <WarningList warnings={result.warnings} /> //=> one card per warning
 */
export function WarningList(props: { warnings: readonly Warning[]; empty?: string | undefined; testId?: string | undefined }) {
  if (props.warnings.length === 0) {
    return props.empty ? <p class="quiet">{props.empty}</p> : null;
  }
  return (
    <ul class="warnings" data-testid={props.testId}>
      {props.warnings.map((warning, index) => (
        <li key={`${warning.code}-${warning.entryId ?? warning.roomId ?? warning.circuitLabel ?? ''}-${index}`} class={`warning warning--${warning.severity}`} data-code={warning.code}>
          <p class="warning-head">
            <SeverityTag severity={warning.severity} />
            {warning.safety && <span class="tag tag--safety">Safety</span>}
            <strong>{warning.title}</strong>
          </p>
          <p>{warning.message}</p>
          <p class="warning-action">
            <strong>What to do: </strong>
            {warning.action}
          </p>
        </li>
      ))}
    </ul>
  );
}

/**
 * Counts per severity as small badges (room and entry lists).
 *
 * @example <WarningBadges counts={{ danger: 1, caution: 2, advice: 0 }} /> //=> two badges: 1 hazard, 2 rethink
 */
export function WarningBadges(props: { counts: Readonly<Record<Severity, number>> }) {
  const order: Severity[] = ['danger', 'caution', 'advice'];
  const shown = order.filter((severity) => props.counts[severity] > 0);
  if (shown.length === 0) return null;
  return (
    <span class="badges">
      {shown.map((severity) => (
        <span key={severity} class={`badge badge--${severity}`} title={severityLabels[severity]}>
          <Icon name={severityIcons[severity]} size={16} />
          <span class="visually-hidden">{severityLabels[severity]}: </span>
          {props.counts[severity]}
        </span>
      ))}
    </span>
  );
}

/**
 * Counts warnings per severity.
 *
 * @example countWarnings(entryResult.warnings) //=> { danger: 0, caution: 2, advice: 1 }
 */
export function countWarnings(warnings: readonly Warning[]): Record<Severity, number> {
  const counts: Record<Severity, number> = { danger: 0, caution: 0, advice: 0 };
  for (const warning of warnings) counts[warning.severity] += 1;
  return counts;
}

/** Warnings of one kind across a survey. */
interface WarningGroup {
  first: Warning;
  count: number;
  roomIds: Set<string>;
}

/**
 * A survey's warnings, one line per kind (a big survey can hold hundreds of
 * the same warning): the title, how many fixtures and rooms, and what to do,
 * with the rooms named.
 *
 * @example <WarningGroups warnings={result.warnings} roomNames={names} /> //=> one card per kind of warning
 */
export function WarningGroups(props: { warnings: readonly Warning[]; roomNames: ReadonlyMap<string, string>; empty?: string | undefined; testId?: string | undefined }) {
  const groups = new Map<string, WarningGroup>();
  for (const warning of props.warnings) {
    const key = `${warning.severity}:${warning.code}`;
    let group = groups.get(key);
    if (!group) {
      group = { first: warning, count: 0, roomIds: new Set() };
      groups.set(key, group);
    }
    group.count += 1;
    if (warning.roomId) group.roomIds.add(warning.roomId);
  }
  if (groups.size === 0) return props.empty ? <p class="quiet">{props.empty}</p> : null;
  return (
    <ul class="warnings" data-testid={props.testId}>
      {[...groups.values()].map(({ first, count, roomIds }) => {
        const names = [...roomIds].map((id) => props.roomNames.get(id) ?? '').filter(Boolean);
        const where = names.length === 0 ? '' : names.length <= 3 ? names.join(', ') : `${names.slice(0, 3).join(', ')} and ${names.length - 3} more rooms`;
        return (
          <li key={`${first.severity}-${first.code}`} class={`warning warning--${first.severity}`} data-code={first.code}>
            <p class="warning-head">
              <SeverityTag severity={first.severity} />
              {first.safety && <span class="tag tag--safety">Safety</span>}
              <strong>{first.title}</strong>
              {count > 1 && <span class="tag">×{count}</span>}
            </p>
            {count === 1 && <p>{first.message}</p>}
            {where && <p class="warning-where">In {where}.</p>}
            <p class="warning-action">
              <strong>What to do: </strong>
              {first.action}
            </p>
          </li>
        );
      })}
    </ul>
  );
}
