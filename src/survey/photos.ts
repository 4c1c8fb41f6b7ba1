/**
 * Photos between their stored form (Blobs) and their file form (base64 text),
 * and the checks a new photo passes before it is stored.
 */
import type { SurveyFilePhoto } from './format.ts';
import type { Photo, PhotoMimeType } from './model.ts';
import type { FileProblem } from './validate.ts';

/** Image types a photo may have. */
export const photoMimeTypes: readonly PhotoMimeType[] = ['image/jpeg', 'image/png', 'image/webp'];

/** Largest image or thumbnail the store accepts, in bytes (the capture screen downscales well below this). */
export const maxPhotoBytes = 20_000_000;

/**
 * Base64 text (RFC 4648 standard alphabet, padded) of some bytes.
 *
 * @example
 * bytesToBase64(new Uint8Array([72, 105])) //=> 'SGk='
 */
export function bytesToBase64(bytes: Uint8Array): string {
  const chunk = 0x8000;
  let binary = '';
  for (let start = 0; start < bytes.length; start += chunk) {
    binary += String.fromCharCode(...bytes.subarray(start, start + chunk));
  }
  return btoa(binary);
}

/**
 * The bytes of base64 text (already checked by the file validator).
 *
 * @example
 * base64ToBytes('SGk=') //=> Uint8Array [72, 105]
 */
export function base64ToBytes(base64: string): Uint8Array<ArrayBuffer> {
  const binary = atob(base64);
  const bytes = new Uint8Array(binary.length);
  for (let index = 0; index < binary.length; index++) bytes[index] = binary.charCodeAt(index);
  return bytes;
}

/**
 * A photo as written in a survey file. Reads both Blobs, so call it outside
 * any database transaction.
 *
 * @example
 * await photoToFile(photo)
 * //=> { id: photo.id, ownerKind: 'room', …, imageBase64: 'iVBORw0…', thumbnailBase64: 'iVBORw0…' }
 */
export async function photoToFile(photo: Photo): Promise<SurveyFilePhoto> {
  const [image, thumbnail] = await Promise.all([photo.image.arrayBuffer(), photo.thumbnail.arrayBuffer()]);
  return {
    id: photo.id,
    ownerKind: photo.ownerKind,
    ownerId: photo.ownerId,
    surveyId: photo.surveyId,
    mimeType: photo.mimeType,
    widthPixels: photo.widthPixels,
    heightPixels: photo.heightPixels,
    createdAt: photo.createdAt,
    imageBase64: bytesToBase64(new Uint8Array(image)),
    thumbnailMimeType: photo.thumbnailMimeType,
    thumbnailBase64: bytesToBase64(new Uint8Array(thumbnail)),
  };
}

/**
 * A photo read from a (validated) survey file, with its pictures as Blobs.
 *
 * @example
 * photoFromFile(filePhoto).image.size //=> number of bytes in filePhoto.imageBase64
 */
export function photoFromFile(file: SurveyFilePhoto): Photo {
  return {
    id: file.id,
    ownerKind: file.ownerKind,
    ownerId: file.ownerId,
    surveyId: file.surveyId,
    mimeType: file.mimeType,
    widthPixels: file.widthPixels,
    heightPixels: file.heightPixels,
    createdAt: file.createdAt,
    image: new Blob([base64ToBytes(file.imageBase64)], { type: file.mimeType }),
    thumbnailMimeType: file.thumbnailMimeType,
    thumbnail: new Blob([base64ToBytes(file.thumbnailBase64)], { type: file.thumbnailMimeType }),
  };
}

/** What a screen hands over to store a new photo (already downscaled, with its thumbnail). */
export interface NewPhoto {
  ownerKind: Photo['ownerKind'];
  ownerId: string;
  mimeType: PhotoMimeType;
  widthPixels: number;
  heightPixels: number;
  image: Blob;
  thumbnailMimeType: PhotoMimeType;
  thumbnail: Blob;
}

function checkPicture(blob: unknown, field: string, problems: FileProblem[]): void {
  if (!(blob instanceof Blob)) problems.push({ path: field, message: 'must be an image (a Blob)' });
  else if (blob.size === 0) problems.push({ path: field, message: 'is empty (0 bytes)' });
  else if (blob.size > maxPhotoBytes) {
    problems.push({ path: field, message: `is too large: ${blob.size} bytes, over the ${maxPhotoBytes} byte limit; downscale it first` });
  }
}

/**
 * Problems with a new photo before it is stored; an empty list when it is fine.
 *
 * @example
 * newPhotoProblems({ ...photo, widthPixels: 0 })
 * //=> [{ path: 'widthPixels', message: 'must be a whole number between 1 and 100000 (got 0)' }]
 */
export function newPhotoProblems(photo: NewPhoto): FileProblem[] {
  const problems: FileProblem[] = [];
  if (photo.ownerKind !== 'room' && photo.ownerKind !== 'entry') {
    problems.push({ path: 'ownerKind', message: `must be "room" or "entry" (got ${JSON.stringify(photo.ownerKind)})` });
  }
  for (const field of ['mimeType', 'thumbnailMimeType'] as const) {
    if (!photoMimeTypes.includes(photo[field])) {
      problems.push({ path: field, message: `must be one of ${photoMimeTypes.join(', ')} (got ${JSON.stringify(photo[field])})` });
    }
  }
  for (const field of ['widthPixels', 'heightPixels'] as const) {
    const value = photo[field];
    if (!Number.isInteger(value) || value < 1 || value > 100_000) {
      problems.push({ path: field, message: `must be a whole number between 1 and 100000 (got ${String(value)})` });
    }
  }
  checkPicture(photo.image, 'image', problems);
  checkPicture(photo.thumbnail, 'thumbnail', problems);
  return problems;
}
