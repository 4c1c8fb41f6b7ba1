/**
 * The "add something" pattern of the field screens: a button that opens a
 * small form; the form's submit runs the add (busy while it runs, a failure
 * shown as an error notice, nothing kept half-done), Cancel closes it.
 */
import type { ComponentChildren } from 'preact';
import { useState } from 'preact/hooks';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { Icon } from './Icon.tsx';

export interface AddFormProps {
  /** Text of the button that opens the form, e.g. "Add a room". */
  openLabel: string;
  openTestId: string;
  /** Extra classes on the opening button. */
  openClass?: string;
  /** Accessible name of the form, e.g. "New room". */
  formLabel: string;
  submitLabel: string;
  submitTestId?: string;
  /** True when every required field holds a value. */
  ready: boolean;
  /** Stores the new thing; a thrown error is shown to the user. */
  onAdd: () => Promise<void>;
  /** Shown above the fields. */
  lead?: ComponentChildren;
  /** Shown under the buttons while the form is not ready. */
  notReadyHint?: ComponentChildren;
  children: ComponentChildren;
}

/**
 * @example <AddForm openLabel="Add a room" … ready={ready} onAdd={add}>{fields}</AddForm> //=> a button; pressed, the form
 */
export function AddForm(props: AddFormProps) {
  const { notify } = useApp();
  const [open, setOpen] = useState(false);
  const [busy, setBusy] = useState(false);

  const submit = async () => {
    if (!props.ready) return;
    setBusy(true);
    try {
      await props.onAdd();
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    } finally {
      setBusy(false);
    }
  };

  if (!open) {
    return (
      <button type="button" class={`button button--primary${props.openClass ? ` ${props.openClass}` : ''}`} onClick={() => setOpen(true)} data-testid={props.openTestId}>
        <Icon name="plus" />
        {props.openLabel}
      </button>
    );
  }
  return (
    <form
      class="subpanel"
      aria-label={props.formLabel}
      onSubmit={(event) => {
        event.preventDefault();
        void submit();
      }}
    >
      {props.lead}
      <div class="grid-fields">{props.children}</div>
      <div class="actions">
        <button type="submit" class="button button--primary" disabled={!props.ready || busy} data-testid={props.submitTestId}>
          {props.submitLabel}
        </button>
        <button type="button" class="button button--quiet" onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
      {!props.ready && props.notReadyHint}
    </form>
  );
}
