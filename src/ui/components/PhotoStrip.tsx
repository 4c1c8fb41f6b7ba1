/**
 * Photos of a room or a fixture: taken with the camera (or picked), made
 * smaller in the browser before they are stored, shown as thumbnails; tap one
 * to see it large. Deleting one can be undone.
 */
import { useEffect, useId, useState } from 'preact/hooks';
import type { PhotoOwnerKind, PhotoThumbnail } from '../../survey/model.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { preparePhoto } from '../state/images.ts';
import { Icon } from './Icon.tsx';

interface Shown {
  thumbnail: PhotoThumbnail;
  url: string;
}

function LargePhoto(props: { photoId: string; onClose: () => void }) {
  const { store } = useApp();
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    let made: string | null = null;
    store.getPhoto(props.photoId).then(
      (photo) => {
        made = URL.createObjectURL(photo.image);
        setUrl(made);
      },
      () => undefined,
    );
    return () => {
      if (made) URL.revokeObjectURL(made);
    };
  }, [props.photoId]);
  return (
    <div class="photo-large">
      {url ? <img src={url} alt="The photo, full size" /> : <p>Opening the photo…</p>}
      <button type="button" class="button" onClick={props.onClose}>
        <Icon name="close" />
        Close
      </button>
    </div>
  );
}

/**
 * The photos of a room or entry with the camera button.
 *
 * @example <PhotoStrip ownerKind="room" ownerId={room.id} label="Shop floor" /> //=> thumbnails and "Photo of Shop floor"
 */
export function PhotoStrip(props: { ownerKind: PhotoOwnerKind; ownerId: string; label: string; onChanged?: () => void }) {
  const { store, notify } = useApp();
  const inputId = useId();
  const [shown, setShown] = useState<Shown[]>([]);
  const [version, setVersion] = useState(0);
  const [busy, setBusy] = useState(false);
  const [large, setLarge] = useState<string | null>(null);

  useEffect(() => {
    let made: Shown[] = [];
    let live = true;
    store.listThumbnails(props.ownerId).then(
      (list) => {
        if (!live) return;
        made = list.map((thumbnail) => ({ thumbnail, url: URL.createObjectURL(thumbnail.thumbnail) }));
        setShown(made);
      },
      (error: unknown) => notify({ tone: 'error', text: messageOf(error) }),
    );
    return () => {
      live = false;
      for (const item of made) URL.revokeObjectURL(item.url);
    };
  }, [props.ownerId, version]);

  const take = async (event: Event) => {
    const input = event.currentTarget as HTMLInputElement;
    const files = [...(input.files ?? [])];
    input.value = '';
    if (files.length === 0) return;
    setBusy(true);
    try {
      for (const file of files) await store.addPhoto(await preparePhoto(file, { ownerKind: props.ownerKind, ownerId: props.ownerId }));
      setVersion((v) => v + 1);
      props.onChanged?.();
    } catch (error) {
      notify({ tone: 'error', text: `The photo was not saved. ${messageOf(error)}` });
    } finally {
      setBusy(false);
    }
  };

  const remove = async (photoId: string) => {
    try {
      const trashId = await store.deletePhoto(photoId);
      setVersion((v) => v + 1);
      notify({
        tone: 'info',
        text: 'Photo deleted.',
        action: {
          label: 'Undo',
          run: async () => {
            await store.restoreFromTrash(trashId);
            setVersion((v) => v + 1);
          },
        },
      });
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    }
  };

  return (
    <div class="photos">
      {shown.length > 0 && (
        <ul class="photo-list">
          {shown.map((item, index) => (
            <li key={item.thumbnail.id}>
              <button type="button" class="photo-thumb" onClick={() => setLarge(item.thumbnail.id)} aria-label={`Show photo ${index + 1} of ${props.label} large`}>
                <img src={item.url} alt="" width={96} height={96} />
              </button>
              <button type="button" class="icon-button" onClick={() => remove(item.thumbnail.id)} aria-label={`Delete photo ${index + 1}`}>
                <Icon name="trash" size={20} />
              </button>
            </li>
          ))}
        </ul>
      )}
      {large && <LargePhoto photoId={large} onClose={() => setLarge(null)} />}
      <input id={inputId} class="visually-hidden" type="file" accept="image/*" capture="environment" multiple onChange={take} disabled={busy} data-testid={`photo-input-${props.ownerKind}`} />
      <label class="button file-button" for={inputId}>
        <Icon name="camera" />
        {busy ? 'Saving the photo…' : `Photo of ${props.label}`}
      </label>
    </div>
  );
}
