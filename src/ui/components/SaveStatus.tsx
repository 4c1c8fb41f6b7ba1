/** The autosave state: saved, saving, or not saved with the reason. */
import type { QueueStatus } from '../state/queue.ts';
import { Icon } from './Icon.tsx';

/**
 * "Saved", "Saving…" or why not saved.
 *
 * @example <SaveStatus status={{ pending: 0, error: null }} /> //=> "Saved on this device"
 */
export function SaveStatus(props: { status: QueueStatus }) {
  const { pending, error } = props.status;
  if (error) {
    return (
      <p class="save-status save-status--bad" role="alert" data-testid="save-status">
        <Icon name="rethink" size={18} /> Not saved: {error}
      </p>
    );
  }
  return (
    <p class="save-status" aria-live="polite" data-testid="save-status" data-pending={pending}>
      {pending > 0 ? (
        'Saving…'
      ) : (
        <>
          <Icon name="check" size={18} /> Saved on this device
        </>
      )}
    </p>
  );
}
