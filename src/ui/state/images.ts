/**
 * Photos from the camera, made small enough to keep: the longest side is
 * brought down to 1,600 px (JPEG) and a 240 px thumbnail is made for lists.
 * Runs in the browser only (canvas).
 */
import type { NewPhoto } from '../../survey/photos.ts';

/** Longest side of a stored photo, px. */
export const photoLongestSide = 1600;
/** Longest side of a thumbnail, px. */
export const thumbnailLongestSide = 240;

/**
 * The size that fits `width` × `height` within `longest` on its longer side (never enlarged).
 *
 * @example fitWithin(4000, 3000, 1600) //=> { width: 1600, height: 1200 }
 */
export function fitWithin(width: number, height: number, longest: number): { width: number; height: number } {
  const scale = Math.min(1, longest / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

async function decode(file: Blob): Promise<{ source: CanvasImageSource; width: number; height: number; close: () => void }> {
  if (typeof createImageBitmap === 'function') {
    const bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' });
    return { source: bitmap, width: bitmap.width, height: bitmap.height, close: () => bitmap.close() };
  }
  const url = URL.createObjectURL(file);
  try {
    const image = new Image();
    image.src = url;
    await image.decode();
    return { source: image, width: image.naturalWidth, height: image.naturalHeight, close: () => undefined };
  } finally {
    URL.revokeObjectURL(url);
  }
}

async function draw(source: CanvasImageSource, width: number, height: number, quality: number, type: 'image/jpeg' | 'image/png'): Promise<Blob> {
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  const context = canvas.getContext('2d');
  if (!context) throw new Error('this browser cannot draw images');
  if (type === 'image/jpeg') {
    context.fillStyle = '#fff';
    context.fillRect(0, 0, width, height);
  }
  context.drawImage(source, 0, 0, width, height);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, type, quality));
  if (!blob) throw new Error('this browser could not encode the image');
  return blob;
}

/**
 * A camera or gallery picture downscaled to a photo and a thumbnail for `owner`.
 *
 * @example (await preparePhoto(file, { ownerKind: 'room', ownerId: 'r1' })).mimeType //=> 'image/jpeg'
 */
export async function preparePhoto(file: Blob, owner: Pick<NewPhoto, 'ownerKind' | 'ownerId'>): Promise<NewPhoto> {
  const picture = await decode(file);
  try {
    const size = fitWithin(picture.width, picture.height, photoLongestSide);
    const small = fitWithin(picture.width, picture.height, thumbnailLongestSide);
    const [image, thumbnail] = await Promise.all([
      draw(picture.source, size.width, size.height, 0.85, 'image/jpeg'),
      draw(picture.source, small.width, small.height, 0.8, 'image/jpeg'),
    ]);
    return { ...owner, mimeType: 'image/jpeg', widthPixels: size.width, heightPixels: size.height, image, thumbnailMimeType: 'image/jpeg', thumbnail };
  } finally {
    picture.close();
  }
}

/**
 * A logo for documents: at most 600 px on its longer side, PNG (keeps transparency), as a data URL.
 *
 * @example (await prepareLogo(file)).dataUrl.startsWith('data:image/png') //=> true
 */
export async function prepareLogo(file: Blob): Promise<{ dataUrl: string; width: number; height: number }> {
  const picture = await decode(file);
  try {
    const size = fitWithin(picture.width, picture.height, 600);
    const blob = await draw(picture.source, size.width, size.height, 1, 'image/png');
    const dataUrl = await new Promise<string>((resolve, reject) => {
      const reader = new FileReader();
      reader.onload = () => resolve(String(reader.result));
      reader.onerror = () => reject(reader.error ?? new Error('the logo could not be read'));
      reader.readAsDataURL(blob);
    });
    return { dataUrl, ...size };
  } finally {
    picture.close();
  }
}
