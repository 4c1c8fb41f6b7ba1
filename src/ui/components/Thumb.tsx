/**
 * The first photo of a room or entry, small, for lists. Read when it scrolls
 * into view (lists of a big survey stay quick), released when it leaves.
 */
import { useEffect, useRef, useState } from 'preact/hooks';
import type { SurveyStore } from '../../survey/store.ts';

/**
 * The first photo of a room or entry, small.
 *
 * @example <Thumb store={store} ownerId={room.id} alt="" /> //=> a 48 px picture, or an empty frame
 */
export function Thumb(props: { store: SurveyStore; ownerId: string; alt: string }) {
  const holder = useRef<HTMLSpanElement>(null);
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    let made: string | null = null;
    let done = false;
    const load = () => {
      props.store.listThumbnails(props.ownerId).then(
        ([first]) => {
          if (done || !first) return;
          made = URL.createObjectURL(first.thumbnail);
          setUrl(made);
        },
        () => undefined,
      );
    };
    let observer: IntersectionObserver | null = null;
    if (typeof IntersectionObserver === 'function' && holder.current) {
      observer = new IntersectionObserver((seen) => {
        if (seen.some((item) => item.isIntersecting)) {
          observer?.disconnect();
          load();
        }
      });
      observer.observe(holder.current);
    } else load();
    return () => {
      done = true;
      observer?.disconnect();
      if (made) URL.revokeObjectURL(made);
    };
  }, [props.ownerId]);
  return <span ref={holder} class="thumb">{url && <img src={url} alt={props.alt} width={48} height={48} />}</span>;
}
