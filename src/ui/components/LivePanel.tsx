/**
 * The entry's figures as they stand after the last keystroke: watts before
 * and after, energy, money, payback, light, apparent power — and what could
 * go wrong, with what to do.
 */
import type { EntryResult } from '../../calc/survey.ts';
import type { UiFigures } from '../state/format.ts';
import { WarningBadges, WarningList, countWarnings } from './Warnings.tsx';

const verdictWords = { short: 'less light than now', ok: 'about the same light', over: 'much more light than now' } as const;

/**
 * An entry's figures after the last change.
 *
 * @example <LiveFigures result={entryResult} fig={fig} /> //=> W, kWh/yr, money/yr, payback, light and VA
 */
export function LiveFigures(props: { result: EntryResult; fig: UiFigures }) {
  const { result, fig } = props;
  const e = result.existing;
  const p = result.proposed;
  const ratio = result.lumenRatio;
  return (
    <dl class="live" data-testid="live-panel">
      <div>
        <dt>Watts per fixture</dt>
        <dd data-testid="live-watts">
          {fig.watts(e.wattsPerFixture, 1)} → {fig.watts(p.wattsPerFixture, 1)}
        </dd>
      </div>
      <div>
        <dt>All {fig.number(result.count)}</dt>
        <dd>
          {fig.watts(e.watts)} → {fig.watts(p.watts)}
        </dd>
      </div>
      <div>
        <dt>Energy saved</dt>
        <dd data-testid="live-kwh">{fig.kwhPerYear(result.savings.kwhPerYear)}</dd>
      </div>
      <div>
        <dt>Money saved</dt>
        <dd data-testid="live-money">{fig.money(result.money.totalPerYear)}/yr</dd>
      </div>
      <div>
        <dt>Payback</dt>
        <dd data-testid="live-payback">{result.proposedName === null ? '—' : fig.payback(result.money.simplePaybackYears)}</dd>
      </div>
      <div>
        <dt>Light per fixture</dt>
        <dd data-testid="live-lumens">{ratio === null ? 'not known' : `${fig.percent(ratio, 0)} of now${result.lumenVerdict ? `, ${verdictWords[result.lumenVerdict]}` : ''}`}</dd>
      </div>
      <div>
        <dt>Apparent power</dt>
        <dd>
          {fig.voltAmperes(e.voltAmperes)} → {fig.voltAmperes(p.voltAmperes)} (PF {fig.number(p.powerFactor, 2)})
        </dd>
      </div>
    </dl>
  );
}

/**
 * An entry's warnings with what to do.
 *
 * @example <LiveWarnings result={entryResult} /> //=> the badges and the warning cards
 */
export function LiveWarnings(props: { result: EntryResult }) {
  return (
    <>
      <p>
        <WarningBadges counts={countWarnings(props.result.warnings)} />
        {props.result.warnings.length === 0 ? ' Nothing to watch for this fixture.' : ''}
      </p>
      <WarningList warnings={props.result.warnings} testId="entry-warnings" />
    </>
  );
}
