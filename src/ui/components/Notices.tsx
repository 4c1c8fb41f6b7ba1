/**
 * The notice area at the bottom of the screen: what just happened, and an
 * Undo after a delete. A notice stays while it has focus or the pointer is on
 * it; deleted things can also be brought back from Settings › Recently deleted.
 * An error (e.g. the device is full) stays until it is closed: it says what to
 * do, and the user must have time to read it.
 */
import { useEffect, useRef, useState } from 'preact/hooks';
import type { Notice } from '../state/context.ts';
import { Icon } from './Icon.tsx';

const showMs = 12_000;

/**
 * The notice area at the bottom of the screen.
 *
 * @example <Notices notice={{ tone: "info", text: "Deleted." }} onDismiss={close} /> //=> the message with a close button
 */
export function Notices(props: { notice: Notice | null; onDismiss: () => void }) {
  const { notice, onDismiss } = props;
  const [held, setHeld] = useState(false);
  const [busy, setBusy] = useState(false);
  const timer = useRef<number | undefined>(undefined);

  useEffect(() => {
    window.clearTimeout(timer.current);
    if (notice && !held && notice.tone !== 'error') timer.current = window.setTimeout(onDismiss, showMs);
    return () => window.clearTimeout(timer.current);
  }, [notice, held]);

  return (
    <div class="notices" role="status" aria-live="polite" onPointerEnter={() => setHeld(true)} onPointerLeave={() => setHeld(false)} onFocusIn={() => setHeld(true)} onFocusOut={() => setHeld(false)}>
      {notice && (
        <div class={`notice notice--${notice.tone}`} data-testid="notice">
          <p>{notice.text}</p>
          {notice.action && (
            <button
              type="button"
              class="button button--on-dark"
              disabled={busy}
              onClick={async () => {
                setBusy(true);
                try {
                  await notice.action?.run();
                } finally {
                  setBusy(false);
                }
              }}
            >
              {notice.action.label === 'Undo' && <Icon name="undo" size={20} />}
              {notice.action.label}
            </button>
          )}
          <button type="button" class="icon-button icon-button--on-dark" onClick={onDismiss} aria-label="Close this message">
            <Icon name="close" size={20} />
          </button>
        </div>
      )}
    </div>
  );
}
