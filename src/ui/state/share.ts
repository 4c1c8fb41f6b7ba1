/**
 * Handing a finished file to the user: the system share sheet where the
 * browser can share files (phones), otherwise a download.
 */

/** A file ready to hand over. */
export interface OutgoingFile {
  fileName: string;
  mimeType: string;
  bytes: Uint8Array | string;
}

/** How the file left: shared, downloaded, or the user closed the share sheet. */
export type Delivery = 'shared' | 'downloaded' | 'cancelled';

function asFile(file: OutgoingFile): File {
  const part: BlobPart = typeof file.bytes === 'string' ? file.bytes : new Uint8Array(file.bytes);
  return new File([part], file.fileName, { type: file.mimeType });
}

/**
 * True when this browser can share this file through the system share sheet.
 *
 * @example canShareFile({ fileName: 'a.pdf', mimeType: 'application/pdf', bytes }) //=> true on most phones, false on desktop Linux
 */
export function canShareFile(file: OutgoingFile): boolean {
  if (typeof navigator === 'undefined' || typeof navigator.canShare !== 'function' || typeof navigator.share !== 'function') return false;
  try {
    return navigator.canShare({ files: [asFile(file)] });
  } catch {
    return false;
  }
}

/**
 * Starts a download of the file.
 *
 * @example download({ fileName: 'a.csv', mimeType: 'text/csv', bytes: 'x' }) //=> the browser saves a.csv
 */
export function download(file: OutgoingFile): void {
  const url = URL.createObjectURL(asFile(file));
  const link = document.createElement('a');
  link.href = url;
  link.download = file.fileName;
  link.rel = 'noopener';
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 30_000);
}

/**
 * Shares the file when the browser can (and `preferShare`), else downloads it.
 * A share refused for lack of a fresh tap (`NotAllowedError`) falls back to a download.
 *
 * @example await deliver({ fileName: 'report.pdf', mimeType: 'application/pdf', bytes }) //=> 'shared' on a phone, 'downloaded' elsewhere
 */
export async function deliver(file: OutgoingFile, preferShare = true): Promise<Delivery> {
  if (preferShare && canShareFile(file)) {
    try {
      await navigator.share({ files: [asFile(file)], title: file.fileName });
      return 'shared';
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError') return 'cancelled';
      // NotAllowedError (the tap is too long ago) or a share target failure: download instead.
    }
  }
  download(file);
  return 'downloaded';
}
