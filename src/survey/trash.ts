/**
 * Moving records to the trash and back, inside a transaction the caller
 * opened. A trash item carries every record that went with the deleted thing
 * (a room's entries, the photos of both), so restoring it puts back exactly
 * what was there.
 */
import { isBefore, parseISO, subDays } from 'date-fns';
import { tracked, type AnyTx, type StoredPhoto, type WriteTx } from './db.ts';
import type { Photo, PhotoThumbnail, Portfolio, StoredEntry, StoredRoom, SurveyHeader, TrashItem, TrashKind } from './model.ts';
import { StoreError } from './store-error.ts';

/** Deleted things stay restorable for at least this many days; older ones are removed at start-up. */
export const trashRetentionDays = 30;

/**
 * A photo from its two stored halves.
 *
 * @example
 * joinPhoto(image, thumbnail).thumbnail === thumbnail.thumbnail //=> true
 */
export function joinPhoto(image: StoredPhoto, thumbnail: PhotoThumbnail | undefined): Photo {
  return {
    ...image,
    thumbnailMimeType: thumbnail?.thumbnailMimeType ?? image.mimeType,
    thumbnail: thumbnail?.thumbnail ?? image.image,
  };
}

/**
 * A photo split into its two stored halves.
 *
 * @example
 * splitPhoto(photo).image.image === photo.image //=> true
 */
export function splitPhoto(photo: Photo): { image: StoredPhoto; thumbnail: PhotoThumbnail } {
  const { thumbnail, thumbnailMimeType, ...image } = photo;
  const { image: _image, widthPixels: _width, heightPixels: _height, ...rest } = photo;
  return { image, thumbnail: { ...rest, thumbnail, thumbnailMimeType } };
}

/**
 * Every photo of these owners (rooms or entries).
 *
 * @example
 * (await photosOf(tx, ['demo-shop'])).map((photo) => photo.ownerId) //=> ['demo-shop', …]
 */
export async function photosOf<M extends IDBTransactionMode>(tx: AnyTx<M>, ownerIds: readonly string[]): Promise<Photo[]> {
  const photos = tx.objectStore('photos').index('byOwner');
  const thumbnails = tx.objectStore('thumbnails').index('byOwner');
  const lists = await Promise.all(
    ownerIds.map((ownerId) => Promise.all([tracked(photos.getAll(ownerId)), tracked(thumbnails.getAll(ownerId))])),
  );
  const out: Photo[] = [];
  for (const [images, thumbs] of lists) {
    const byId = new Map(thumbs.map((thumb) => [thumb.id, thumb]));
    for (const image of images) out.push(joinPhoto(image, byId.get(image.id)));
  }
  return out;
}

/**
 * A survey's header, rooms, entries and photos. Throws `not-found` when the survey is not stored.
 *
 * @example
 * (await surveyParts(tx, 'demo-tallowmere')).rooms.length //=> 6
 */
export async function surveyParts<M extends IDBTransactionMode>(
  tx: AnyTx<M>,
  surveyId: string,
): Promise<{ survey: SurveyHeader; rooms: StoredRoom[]; entries: StoredEntry[]; photos: Photo[] }> {
  const [survey, rooms, entries, images, thumbs] = await Promise.all([
    tracked(tx.objectStore('surveys').get(surveyId)),
    tracked(tx.objectStore('rooms').index('bySurvey').getAll(surveyId)),
    tracked(tx.objectStore('entries').index('bySurvey').getAll(surveyId)),
    tracked(tx.objectStore('photos').index('bySurvey').getAll(surveyId)),
    tracked(tx.objectStore('thumbnails').index('bySurvey').getAll(surveyId)),
  ]);
  if (!survey) throw new StoreError('not-found', 'That survey is no longer on this device (it may have been deleted in another tab).');
  const byId = new Map(thumbs.map((thumb) => [thumb.id, thumb]));
  return { survey, rooms, entries, photos: images.map((image) => joinPhoto(image, byId.get(image.id))) };
}

/**
 * A new trash item.
 *
 * @example
 * makeTrashItem('entry', { label: 'Exit sign', surveyId: 's1', parentId: 'r1', entries: [entry] }, stamp).kind //=> 'entry'
 */
export function makeTrashItem(
  kind: TrashKind,
  fields: {
    label: string;
    surveyId: string;
    parentId: string | null;
    survey?: SurveyHeader;
    rooms?: StoredRoom[];
    entries?: StoredEntry[];
    photos?: Photo[];
    portfolio?: Portfolio;
  },
  deletedAt: string,
): TrashItem {
  return {
    id: crypto.randomUUID(),
    kind,
    label: fields.label,
    deletedAt,
    surveyId: fields.surveyId,
    parentId: fields.parentId,
    survey: fields.survey ?? null,
    rooms: fields.rooms ?? [],
    entries: fields.entries ?? [],
    photos: fields.photos ?? [],
    // Only a portfolio's item has the field: the others stay as they were stored before it existed.
    ...(fields.portfolio ? { portfolio: fields.portfolio } : {}),
  };
}

/**
 * Stores the item in the trash and deletes its records from the live stores.
 *
 * @example
 * await moveToTrash(tx, item) //=> undefined (the room, its entries and photos are gone; the item holds them)
 */
export async function moveToTrash(tx: WriteTx, item: TrashItem): Promise<void> {
  const requests: Promise<unknown>[] = [tracked(tx.objectStore('trash').add(item))];
  if (item.survey) requests.push(tracked(tx.objectStore('surveys').delete(item.survey.id)));
  if (item.portfolio) requests.push(tracked(tx.objectStore('portfolios').delete(item.portfolio.id)));
  for (const room of item.rooms) requests.push(tracked(tx.objectStore('rooms').delete(room.id)));
  for (const entry of item.entries) requests.push(tracked(tx.objectStore('entries').delete(entry.id)));
  for (const photo of item.photos) {
    requests.push(tracked(tx.objectStore('photos').delete(photo.id)), tracked(tx.objectStore('thumbnails').delete(photo.id)));
  }
  await Promise.all(requests);
}

/**
 * Puts the item's records back (with `add`, so a record whose id was reused
 * meanwhile fails the transaction instead of being overwritten) and removes
 * it from the trash. A portfolio comes back without the surveys that are no
 * longer stored (deleted since; restoring one later does not re-add it).
 *
 * @example
 * await putBack(tx, item) //=> undefined (the records are back; the item is gone)
 */
export async function putBack(tx: WriteTx, item: TrashItem): Promise<void> {
  const requests: Promise<unknown>[] = [tracked(tx.objectStore('trash').delete(item.id))];
  if (item.survey) requests.push(tracked(tx.objectStore('surveys').add(item.survey)));
  if (item.portfolio) requests.push(putBackPortfolio(tx, item.portfolio));
  for (const room of item.rooms) requests.push(tracked(tx.objectStore('rooms').add(room)));
  for (const entry of item.entries) requests.push(tracked(tx.objectStore('entries').add(entry)));
  for (const photo of item.photos) {
    const { image, thumbnail } = splitPhoto(photo);
    requests.push(tracked(tx.objectStore('photos').add(image)), tracked(tx.objectStore('thumbnails').add(thumbnail)));
  }
  await Promise.all(requests);
}

/** Adds a portfolio back, keeping only the surveys still stored. */
async function putBackPortfolio(tx: WriteTx, portfolio: Portfolio): Promise<void> {
  const surveys = tx.objectStore('surveys');
  const present = await Promise.all(portfolio.surveyIds.map((id) => tracked(surveys.getKey(id))));
  const surveyIds = portfolio.surveyIds.filter((_id, index) => present[index] !== undefined);
  await tracked(tx.objectStore('portfolios').add({ ...portfolio, surveyIds }));
}

/**
 * Deletes trash items deleted more than {@link trashRetentionDays} days
 * before `now`; returns how many. Reads only the index keys, not the items.
 *
 * @example
 * await purgeExpired(tx, new Date('2026-07-02T00:00:00Z')) //=> 1 (an item deleted on 2026-06-01)
 */
export async function purgeExpired(tx: WriteTx, now: Date): Promise<number> {
  const cutoff = subDays(now, trashRetentionDays);
  const expired: string[] = [];
  let cursor = await tx.objectStore('trash').index('byDeletedAt').openKeyCursor();
  while (cursor) {
    if (isBefore(parseISO(cursor.key), cutoff)) expired.push(cursor.primaryKey);
    cursor = await cursor.continue();
  }
  await Promise.all(expired.map((id) => tracked(tx.objectStore('trash').delete(id))));
  return expired.length;
}

/**
 * Takes these fixture entries out of the repeated layout of their survey
 * (they were deleted or moved to another survey, so no unit can differ in
 * them): each differing unit drops its count for them; the unit itself stays.
 * Writes the survey record only when its layout named one of them.
 *
 * @example
 * await forgetLayoutEntries(tx, 'flat-a', ['e1']) //=> true when a differing unit had a count for e1
 */
export async function forgetLayoutEntries(tx: WriteTx, surveyId: string, entryIds: readonly string[]): Promise<boolean> {
  if (entryIds.length === 0) return false;
  const header = await tx.objectStore('surveys').get(surveyId);
  const layout = header?.layout;
  if (!header || !layout) return false;
  const gone = new Set(entryIds);
  if (!layout.exceptions.some((unit) => unit.entryCounts.some((item) => gone.has(item.entryId)))) return false;
  const exceptions = layout.exceptions.map((unit) => ({ ...unit, entryCounts: unit.entryCounts.filter((item) => !gone.has(item.entryId)) }));
  await tx.objectStore('surveys').put({ ...header, layout: { ...layout, exceptions } });
  return true;
}

/**
 * Takes a survey out of every portfolio that lists it (the survey is being
 * deleted), stamping those portfolios' `updatedAt`. Returns their ids.
 * Restoring the survey from the trash does not put it back in them.
 *
 * @example
 * await removeSurveyFromPortfolios(tx, 'flat-a', stamp) //=> ['pf-1']
 */
export async function removeSurveyFromPortfolios(tx: WriteTx, surveyId: string, stamp: string): Promise<string[]> {
  const portfolios = await tx.objectStore('portfolios').getAll();
  const changed = portfolios.filter((portfolio) => portfolio.surveyIds.includes(surveyId));
  await Promise.all(
    changed.map((portfolio) =>
      tracked(tx.objectStore('portfolios').put({ ...portfolio, surveyIds: portfolio.surveyIds.filter((id) => id !== surveyId), updatedAt: stamp })),
    ),
  );
  return changed.map((portfolio) => portfolio.id);
}
