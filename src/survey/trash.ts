/**
 * Moving records to the trash and back, inside a transaction the caller
 * opened. A trash item carries every record that went with the deleted thing
 * (a room's entries, the photos of both), so restoring it puts back exactly
 * what was there.
 */
import { isBefore, parseISO, subDays } from 'date-fns';
import { tracked, type AnyTx, type StoredPhoto, type WriteTx } from './db.ts';
import type { Photo, PhotoThumbnail, StoredEntry, StoredRoom, SurveyHeader, TrashItem, TrashKind } from './model.ts';
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
  fields: { label: string; surveyId: string; parentId: string | null; survey?: SurveyHeader; rooms?: StoredRoom[]; entries?: StoredEntry[]; photos?: Photo[] },
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
 * it from the trash.
 *
 * @example
 * await putBack(tx, item) //=> undefined (the records are back; the item is gone)
 */
export async function putBack(tx: WriteTx, item: TrashItem): Promise<void> {
  const requests: Promise<unknown>[] = [tracked(tx.objectStore('trash').delete(item.id))];
  if (item.survey) requests.push(tracked(tx.objectStore('surveys').add(item.survey)));
  for (const room of item.rooms) requests.push(tracked(tx.objectStore('rooms').add(room)));
  for (const entry of item.entries) requests.push(tracked(tx.objectStore('entries').add(entry)));
  for (const photo of item.photos) {
    const { image, thumbnail } = splitPhoto(photo);
    requests.push(tracked(tx.objectStore('photos').add(image)), tracked(tx.objectStore('thumbnails').add(thumbnail)));
  }
  await Promise.all(requests);
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
