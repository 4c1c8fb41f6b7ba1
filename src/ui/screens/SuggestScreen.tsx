/**
 * Product suggestions for a survey: for each fixture entry, the catalog
 * product with the lowest life-cycle cost that meets every check (form,
 * light, ratings, CRI, CCT, voltage), beside the current proposal, with one
 * line on why each other product was turned down. Nothing changes until the
 * user accepts — one entry ("Use this") or all at once, after a confirmation
 * saying how many entries change. Accepted proposals are saved through the
 * survey's autosave queue like any edit; the notice offers Undo, and each
 * entry changed here can be put back while the screen is open.
 */
import { useMemo, useState } from 'preact/hooks';
import { chooseProducts, type CandidateOutcome, type EntryChoice, type SurveyChoice } from '../../calc/choice.ts';
import type { ProposedProduct, Survey } from '../../survey/model.ts';
import { Icon } from '../components/Icon.tsx';
import { Screen } from '../components/Layout.tsx';
import { SaveStatus } from '../components/SaveStatus.tsx';
import { Section } from '../components/Section.tsx';
import { href } from '../router.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { uiFigures, type UiFigures } from '../state/format.ts';
import type { SessionSnapshot, SurveySession } from '../state/session.ts';
import { useCatalog } from '../state/useSession.ts';

/** Proposals as they were before this screen changed them, by entry id (null: there was none). */
type Replaced = ReadonlyMap<string, ProposedProduct | null>;

function lccDifference(entry: EntryChoice, fig: UiFigures): string {
  const best = entry.best?.lifeCycleCost;
  const current = entry.current?.lifeCycleCost;
  if (best === null || best === undefined) return '';
  if (current === null || current === undefined) return `${fig.money(best)} over the period`;
  const difference = current - best;
  if (Math.abs(difference) < 0.5) return 'same life-cycle cost';
  return difference > 0 ? `${fig.money(difference)} less over the period` : `${fig.money(-difference)} more over the period`;
}

function CandidateLine(props: { candidate: CandidateOutcome; best: CandidateOutcome | null; fig: UiFigures }) {
  const { candidate, best, fig } = props;
  let why: string;
  if (!candidate.accepted) why = candidate.reasons.map((reason) => reason.message).join('; ') || 'turned down';
  else if (best && candidate.productId === best.productId) why = 'the suggestion: lowest life-cycle cost of those that fit';
  else if (best?.lifeCycleCost != null && candidate.lifeCycleCost != null) why = `fits, but costs ${fig.money(candidate.lifeCycleCost - best.lifeCycleCost)} more over the period`;
  else why = 'fits';
  return (
    <li class={`candidate ${candidate.accepted ? '' : 'candidate--no'}`} data-testid="candidate" data-accepted={candidate.accepted ? 'true' : 'false'}>
      <strong>{candidate.name}</strong>: <span data-testid="candidate-reason">{why}</span>
    </li>
  );
}

function Alternatives(props: { entry: EntryChoice; fig: UiFigures }) {
  const [open, setOpen] = useState(false);
  return (
    <details class="alternatives" onToggle={(event) => setOpen((event.currentTarget as HTMLDetailsElement).open)} data-testid="alternatives">
      <summary>Why not the others?</summary>
      {open && (
        <ul class="plain-list candidates">
          {props.entry.candidates.map((candidate) => (
            <CandidateLine key={candidate.productId ?? 'typed'} candidate={candidate} best={props.entry.best} fig={props.fig} />
          ))}
        </ul>
      )}
    </details>
  );
}

function EntryCard(props: {
  entry: EntryChoice;
  surveyId: string;
  fig: UiFigures;
  replaced: boolean;
  onUse: () => void;
  onRevert: () => void;
}) {
  const { entry, fig } = props;
  const best = entry.best;
  const safetyNotes = best?.notes.filter((note) => note.safety) ?? [];
  return (
    <li class="subpanel suggestion" data-testid="suggestion" data-entry={entry.entryId} data-changed={entry.changed ? 'true' : 'false'}>
      <h3 class="suggestion-title">
        <a href={href({ name: 'entry', surveyId: props.surveyId, roomId: entry.roomId, entryId: entry.entryId })}>
          {entry.count} × {entry.description || 'Fixture'}
        </a>
        <span class="quiet"> in {entry.roomName || 'a room'}</span>
      </h3>
      <dl class="facts suggestion-facts">
        <dt>Now proposed</dt>
        <dd data-testid="suggestion-current">{entry.current ? entry.current.name : 'nothing yet'}</dd>
        <dt>Suggested</dt>
        <dd data-testid="suggestion-best">{best ? best.name : 'nothing in the catalog fits'}</dd>
        {best && (
          <>
            <dt>Life-cycle cost</dt>
            <dd data-testid="suggestion-lcc">{lccDifference(entry, fig)}</dd>
          </>
        )}
      </dl>
      {entry.current && !entry.current.accepted && entry.current.reasons.length > 0 && (
        <p class="quiet">Current proposal: {entry.current.reasons.map((reason) => reason.message).join('; ')}.</p>
      )}
      {safetyNotes.length > 0 && (
        <ul class="plain-list">
          {safetyNotes.map((note) => (
            <li key={note.code} class="nudge">
              <Icon name="hazard" size={20} />
              <span>{note.message}</span>
            </li>
          ))}
        </ul>
      )}
      <div class="actions">
        {entry.changed && (
          <button type="button" class="button button--primary" onClick={props.onUse} data-testid="use-suggestion">
            <Icon name="check" />
            Use this
          </button>
        )}
        {!entry.changed && best && <span class="tag tag--advice">already the suggestion</span>}
        {props.replaced && (
          <button type="button" class="button button--quiet" onClick={props.onRevert} data-testid="revert-suggestion">
            <Icon name="undo" />
            Put the earlier proposal back
          </button>
        )}
      </div>
      {entry.candidates.length > 0 || best ? <Alternatives entry={entry} fig={fig} /> : null}
    </li>
  );
}

function choose(survey: Survey, catalog: Parameters<typeof chooseProducts>[1]): { choice: SurveyChoice | null; error: string | null } {
  try {
    return { choice: chooseProducts(survey, catalog), error: null };
  } catch (error) {
    return { choice: null, error: messageOf(error) };
  }
}

/**
 * The product suggestions of a survey.
 *
 * @example <SuggestScreen session={session} snapshot={snapshot} /> //=> each entry with its suggested product, "Use this" and "Use all suggestions"
 */
export function SuggestScreen(props: { session: SurveySession; snapshot: SessionSnapshot }) {
  const { store, notify } = useApp();
  const { session, snapshot } = props;
  const { survey } = snapshot;
  const fig = uiFigures(survey);
  const { catalog, error: catalogError } = useCatalog(store);
  const { choice, error } = useMemo(() => (catalog ? choose(survey, catalog) : { choice: null, error: null }), [survey, catalog]);
  const [confirming, setConfirming] = useState(false);
  const [replaced, setReplaced] = useState<Replaced>(new Map());
  const changed = choice?.entries.filter((entry) => entry.changed && entry.best) ?? [];
  const saving = changed.reduce((sum, entry) => {
    const best = entry.best?.lifeCycleCost;
    const current = entry.current?.lifeCycleCost;
    return best != null && current != null ? sum + (current - best) : sum;
  }, 0);

  const putBack = (earlier: Replaced) => {
    const refused: string[] = [];
    for (const [entryId, proposed] of earlier) {
      const problem = session.updateEntry(entryId, { proposed });
      if (problem) refused.push(problem);
    }
    setReplaced((current) => {
      const next = new Map(current);
      for (const entryId of earlier.keys()) next.delete(entryId);
      return next;
    });
    if (refused.length > 0) notify({ tone: 'error', text: `Not every proposal could be put back: ${refused[0]}` });
  };

  const accept = (entries: readonly EntryChoice[]) => {
    const before = new Map<string, ProposedProduct | null>();
    const refused: string[] = [];
    for (const entry of entries) {
      if (!entry.best) continue;
      const found = session.findEntry(entry.entryId);
      if (!found) continue;
      const previous = found.entry.proposed;
      const problem = session.updateEntry(entry.entryId, { proposed: entry.best.proposal });
      if (problem) refused.push(`${entry.description}: ${problem}`);
      else before.set(entry.entryId, previous);
    }
    setConfirming(false);
    if (before.size > 0) {
      setReplaced((current) => {
        const next = new Map(current);
        for (const [entryId, proposed] of before) if (!next.has(entryId)) next.set(entryId, proposed);
        return next;
      });
      notify({
        tone: refused.length > 0 ? 'error' : 'info',
        text: `${before.size} ${before.size === 1 ? 'proposal' : 'proposals'} changed to the suggested product.${refused.length > 0 ? ` ${refused.length} refused: ${refused[0]}` : ''}`,
        action: { label: 'Undo', run: () => putBack(before) },
      });
    } else if (refused.length > 0) notify({ tone: 'error', text: `Nothing changed: ${refused[0]}` });
  };

  const counts = choice?.counts;
  return (
    <Screen
      title="Product suggestions"
      section="surveys"
      back={{ route: { name: 'survey', surveyId: survey.id }, label: survey.name || 'Survey' }}
      subtitle={survey.name || undefined}
      aside={<SaveStatus status={snapshot.status} />}
    >
      <p class="quiet">
        For each fixture, the catalog product with the lowest life-cycle cost over {survey.money.analysisYears} years (first cost, energy and lamp
        replacements, in today’s money) among those that fit, give enough light and carry the ratings the fixture needs. Nothing changes until you
        choose “Use this”.
      </p>
      {catalogError && (
        <p class="panel panel--alert" role="alert">
          {catalogError}
        </p>
      )}
      {(error || snapshot.calcError) && (
        <p class="panel panel--alert" role="alert" data-testid="suggest-error">
          Suggestions cannot be worked out: {error ?? snapshot.calcError}
        </p>
      )}
      {!choice && !error && !catalogError && <p role="status">Judging the catalog…</p>}
      {choice && counts && (
        <>
          <Section title="Summary">
            <p data-testid="suggest-summary">
              {counts.entries} fixture {counts.entries === 1 ? 'entry' : 'entries'} judged against {counts.products - counts.retiredProducts} catalog products:{' '}
              <strong>{counts.changed}</strong> would change
              {counts.noFit > 0 ? `, ${counts.noFit} ${counts.noFit === 1 ? 'has' : 'have'} nothing in the catalog that fits` : ''}.
              {counts.changed > 0 && saving > 0.5 ? ` Taking every suggestion lowers the life-cycle cost by ${fig.money(saving)}.` : ''}
            </p>
            {counts.changed > 0 && !confirming && (
              <button type="button" class="button button--primary" onClick={() => setConfirming(true)} data-testid="use-all">
                <Icon name="check" />
                Use all suggestions ({counts.changed})
              </button>
            )}
            {confirming && (
              <div class="banner" role="alertdialog" aria-labelledby="confirm-all" data-testid="confirm-all">
                <p id="confirm-all">
                  Change the proposed product of <strong>{changed.length}</strong> fixture {changed.length === 1 ? 'entry' : 'entries'} to the suggestion?
                  You can undo it from the notice, or put each back here.
                </p>
                <div class="actions">
                  <button type="button" class="button button--primary" onClick={() => accept(changed)} data-testid="confirm-use-all" ref={(button) => button?.focus()}>
                    Change {changed.length} {changed.length === 1 ? 'entry' : 'entries'}
                  </button>
                  <button type="button" class="button button--quiet" onClick={() => setConfirming(false)}>
                    Cancel
                  </button>
                </div>
              </div>
            )}
            {counts.entries === 0 && (
              <p>
                No fixtures in this survey yet. <a href={href({ name: 'survey', surveyId: survey.id })}>Add rooms and fixtures</a> first.
              </p>
            )}
          </Section>
          {choice.entries.length > 0 && (
            <Section title="Fixture by fixture">
              <ul class="plain-list suggestions">
                {choice.entries.map((entry) => (
                  <EntryCard
                    key={entry.entryId}
                    entry={entry}
                    surveyId={survey.id}
                    fig={fig}
                    replaced={replaced.has(entry.entryId)}
                    onUse={() => accept([entry])}
                    onRevert={() => putBack(new Map([[entry.entryId, replaced.get(entry.entryId) ?? null]]))}
                  />
                ))}
              </ul>
            </Section>
          )}
        </>
      )}
    </Screen>
  );
}
