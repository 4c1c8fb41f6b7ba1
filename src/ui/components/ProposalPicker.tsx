/**
 * What the fixture becomes: a product from the catalog that fits (dimmable
 * on a dimmer, enclosed-rated in an enclosed fixture, rated for the damp or
 * wet, listed for emergency circuits, and giving enough light), one typed in
 * for this entry, or no change.
 */
import { useMemo, useState } from 'preact/hooks';
import type { CatalogProduct, FixtureEntry, ProposedProduct, Room, Survey } from '../../survey/model.ts';
import { proposalFromCatalog } from '../../survey/examples.ts';
import { changeFields } from '../../survey/store.ts';
import { judgeProducts, type Candidate } from '../state/fit.ts';
import type { UiFigures } from '../state/format.ts';
import type { SurveySession } from '../state/session.ts';
import { Icon } from './Icon.tsx';
import { ProductFields, type ProductPatch } from './ProductFields.tsx';

/** Products offered at once (the best fits); the rest are one tap further. */
const shownAtOnce = 4;

function CandidateButton(props: { candidate: Candidate; chosen: boolean; onPick: () => void; fig: UiFigures }) {
  const { candidate, chosen, fig } = props;
  const result = candidate.result;
  const fits = candidate.reasons.length === 0;
  return (
    <li>
      <button type="button" class={`pick ${chosen ? 'is-on' : ''} ${fits ? '' : 'pick--misfit'}`} aria-pressed={chosen} onClick={props.onPick} data-testid="product-pick">
        <span class="pick-title">
          {chosen && <Icon name="check" size={18} />}
          {candidate.product.name}
        </span>
        {result && (
          <span class="pick-line">
            {fig.watts(result.proposed.wattsPerFixture)} per fixture · saves {fig.kwhPerYear(result.savings.kwhPerYear)}
            {result.lumenRatio !== null ? ` · ${fig.percent(result.lumenRatio, 0)} of today’s light` : ''}
          </span>
        )}
        {!fits && <span class="pick-line pick-why">Not a fit: {candidate.reasons.join('; ')}</span>}
      </button>
    </li>
  );
}

/**
 * What the fixture becomes: products that fit, all products, typed in, or no change.
 *
 * @example <ProposalPicker session={session} survey={survey} room={room} entry={entry} catalog={catalog} fig={fig} /> //=> the products that fit
 */
export function ProposalPicker(props: { session: SurveySession; survey: Survey; room: Room; entry: FixtureEntry; catalog: readonly CatalogProduct[] | null; fig: UiFigures }) {
  const { session, survey, room, entry, catalog, fig } = props;
  const [showAll, setShowAll] = useState(false);
  const proposed = entry.proposed;
  const isCustom = proposed !== null && proposed.catalogId === undefined;
  // Judge against the entry as it is installed (its conditions and existing equipment), not against its current proposal.
  const judgeKey = JSON.stringify([entry.existing, entry.conditions, entry.count, room.spaceType, room.floor, room.hours, survey.money, survey.units]);
  const candidates = useMemo(() => (catalog ? judgeProducts(survey, room, entry, catalog) : []), [catalog, judgeKey]);
  const fitting = candidates.filter((candidate) => candidate.reasons.length === 0);
  const shown = showAll ? candidates : fitting.slice(0, shownAtOnce);

  const pick = (product: CatalogProduct) => session.updateEntry(entry.id, { proposed: proposalFromCatalog(product) });
  const makeCustom = () => {
    const base: ProposedProduct | null = proposed ?? (candidates[0] ? proposalFromCatalog(candidates[0].product) : null);
    if (!base) return;
    const { catalogId: _link, ...spec } = base;
    session.updateEntry(entry.id, { proposed: { ...spec, name: `${spec.name} (custom)` } });
  };
  const editCustom = (patch: ProductPatch) => (proposed ? session.updateEntry(entry.id, { proposed: changeFields<ProposedProduct>(patch) }) : null);

  return (
    <div class="proposal">
      <p class="current-proposal" data-testid="current-proposal">
        {proposed ? (
          <>
            Swap to <strong>{proposed.name}</strong>
            {isCustom ? ' (typed in for this entry)' : ''}.
          </>
        ) : (
          'No change proposed yet.'
        )}
      </p>
      {catalog === null && <p class="quiet">Opening the catalog…</p>}
      {catalog !== null && fitting.length === 0 && !showAll && <p>No product in the catalog fits this fixture. Show all to see why, or type one in.</p>}
      {shown.length > 0 && (
        <ul class="pick-list" aria-label={showAll ? 'All catalog products' : 'Products that fit'}>
          {shown.map((candidate) => (
            <CandidateButton key={candidate.product.id} candidate={candidate} chosen={proposed?.catalogId === candidate.product.id} onPick={() => pick(candidate.product)} fig={fig} />
          ))}
        </ul>
      )}
      <div class="actions">
        {candidates.length > shown.length || showAll ? (
          <button type="button" class="button button--quiet" onClick={() => setShowAll(!showAll)} aria-expanded={showAll}>
            {showAll ? 'Only products that fit' : `Show all ${candidates.length} products`}
          </button>
        ) : null}
        {!isCustom && (
          <button type="button" class="button button--quiet" onClick={makeCustom} disabled={!proposed && candidates.length === 0}>
            Type in a product
          </button>
        )}
        {proposed && (
          <button type="button" class="button button--quiet" onClick={() => session.updateEntry(entry.id, { proposed: null })}>
            No change
          </button>
        )}
      </div>
      {isCustom && proposed && (
        <ProductFields spec={proposed} locale={survey.locale} currency={survey.money.currency} onChange={editCustom} idPrefix={`entry-${entry.id}`} />
      )}
    </div>
  );
}
