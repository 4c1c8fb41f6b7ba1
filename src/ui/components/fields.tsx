/**
 * Form fields that save as they change. Each shows its label, an optional
 * hint and, when what was typed cannot be used, a message right beside it;
 * only values that pass reach `onChange` (which may still refuse with a
 * message of its own, e.g. from the calculation).
 */
import { useEffect, useId, useRef, useState } from 'preact/hooks';
import { readNumber, type NumberRule } from '../state/fields.ts';
import { inputText } from '../state/format.ts';
import { Icon } from './Icon.tsx';

/** A change handler that may refuse with a message (null: accepted). */
export type Commit<T> = (value: T) => string | null | void;

function FieldMessage(props: { id: string; message: string | null }) {
  return (
    <p class="field-message" id={props.id} aria-live="polite">
      {props.message && (
        <>
          <Icon name="rethink" size={18} /> {props.message}
        </>
      )}
    </p>
  );
}

interface NumberFieldProps {
  label: string;
  value: number | undefined;
  rule: NumberRule;
  locale: string;
  onChange: Commit<number | undefined>;
  unit?: string | undefined;
  hint?: string | undefined;
  /** Extra class on the wrapper, e.g. "field--short". */
  class?: string | undefined;
  digits?: number | undefined;
  testId?: string | undefined;
}

/**
 * A number typed on the phone's number pad; "1.5" and "1,5" both work.
 *
 * @example <NumberField label="Watts" value={32} rule={{ min: 0, max: 1000 }} locale="en-US" onChange={save} /> //=> typing "1,5" calls save(1.5)
 */
export function NumberField(props: NumberFieldProps) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const [text, setText] = useState(() => inputText(props.value, props.locale, props.digits));
  const [message, setMessage] = useState<string | null>(null);
  const [note, setNote] = useState<string | null>(null);

  useEffect(() => {
    const reading = readNumber(text, props.rule);
    const same = reading.ok && (reading.value === props.value || (reading.value !== undefined && props.value !== undefined && Math.abs(reading.value - props.value) < 1e-9));
    if (!same && document.activeElement !== input.current) {
      setText(inputText(props.value, props.locale, props.digits));
      setMessage(null);
    }
  }, [props.value, props.locale]);

  const onInput = (event: Event) => {
    const typed = (event.currentTarget as HTMLInputElement).value;
    setText(typed);
    const reading = readNumber(typed, props.rule);
    if (!reading.ok) {
      setMessage(reading.message);
      setNote(null);
      return;
    }
    const refused = props.onChange(reading.value);
    setMessage(typeof refused === 'string' ? refused : null);
    setNote(reading.note ?? null);
  };

  const onBlur = () => {
    // Leaving a field with a bad value: show the saved value again; the message says why it was not used.
    if (message === null) setText(inputText(props.value, props.locale, props.digits));
  };

  const described = [props.hint ? `${id}-hint` : '', `${id}-msg`].filter(Boolean).join(' ');
  return (
    <div class={`field ${props.class ?? ''} ${message ? 'field--bad' : ''}`}>
      <label for={id}>{props.label}</label>
      <div class="field-box">
        <input
          ref={input}
          id={id}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          value={text}
          aria-invalid={message ? 'true' : 'false'}
          aria-describedby={described}
          onInput={onInput}
          onBlur={onBlur}
          data-testid={props.testId}
        />
        {props.unit && <span class="field-unit">{props.unit}</span>}
      </div>
      {props.hint && (
        <p class="field-hint" id={`${id}-hint`}>
          {props.hint}
        </p>
      )}
      <FieldMessage id={`${id}-msg`} message={message} />
      {note && !message && <p class="field-hint field-note">{note}</p>}
    </div>
  );
}

interface TextFieldProps {
  label: string;
  value: string;
  onChange: Commit<string>;
  multiline?: boolean | undefined;
  hint?: string | undefined;
  maxLength?: number | undefined;
  class?: string | undefined;
  autoComplete?: string | undefined;
  testId?: string | undefined;
}

/**
 * Free text, saved as it is typed.
 *
 * @example <TextField label="Site" value="" onChange={save} /> //=> save is called on every keystroke
 */
export function TextField(props: TextFieldProps) {
  const id = useId();
  const element = useRef<HTMLInputElement & HTMLTextAreaElement>(null);
  const [text, setText] = useState(props.value);
  const [message, setMessage] = useState<string | null>(null);
  const maxLength = props.maxLength ?? 10_000;

  useEffect(() => {
    if (document.activeElement !== element.current) setText(props.value);
  }, [props.value]);

  const onInput = (event: Event) => {
    const typed = (event.currentTarget as HTMLInputElement).value;
    setText(typed);
    if (typed.length > maxLength) {
      setMessage(`At most ${maxLength} characters.`);
      return;
    }
    const refused = props.onChange(typed);
    setMessage(typeof refused === 'string' ? refused : null);
  };
  // Leaving the field: show the saved text again (a save that failed while typing must not stay on screen as if kept).
  const onBlur = () => {
    if (message === null) setText(props.value);
  };
  const shared = {
    id,
    ref: element,
    value: text,
    onInput,
    onBlur,
    'aria-invalid': message ? ('true' as const) : ('false' as const),
    'aria-describedby': [props.hint ? `${id}-hint` : '', `${id}-msg`].filter(Boolean).join(' '),
    'data-testid': props.testId,
  };
  return (
    <div class={`field ${props.class ?? ''} ${message ? 'field--bad' : ''}`}>
      <label for={id}>{props.label}</label>
      {props.multiline ? <textarea rows={3} {...shared} /> : <input type="text" autoComplete={props.autoComplete ?? 'off'} {...shared} />}
      {props.hint && (
        <p class="field-hint" id={`${id}-hint`}>
          {props.hint}
        </p>
      )}
      <FieldMessage id={`${id}-msg`} message={message} />
    </div>
  );
}

interface SelectFieldProps<K extends string> {
  label: string;
  value: K;
  options: readonly { value: K; label: string }[];
  onChange: Commit<K>;
  hint?: string | undefined;
  class?: string | undefined;
  testId?: string | undefined;
}

/**
 * One choice from a list.
 *
 * @example <SelectField label="Ballast" value="none" options={options} onChange={save} /> //=> a labelled select
 */
export function SelectField<K extends string>(props: SelectFieldProps<K>) {
  const id = useId();
  const [message, setMessage] = useState<string | null>(null);
  const onChange = (event: Event) => {
    const chosen = (event.currentTarget as HTMLSelectElement).value;
    const option = props.options.find((item) => item.value === chosen);
    if (!option) return;
    const refused = props.onChange(option.value);
    setMessage(typeof refused === 'string' ? refused : null);
  };
  return (
    <div class={`field ${props.class ?? ''} ${message ? 'field--bad' : ''}`}>
      <label for={id}>{props.label}</label>
      <select
        id={id}
        value={props.value}
        onChange={onChange}
        aria-describedby={[props.hint ? `${id}-hint` : '', `${id}-msg`].filter(Boolean).join(' ')}
        data-testid={props.testId}
      >
        {props.options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      {props.hint && (
        <p class="field-hint" id={`${id}-hint`}>
          {props.hint}
        </p>
      )}
      <FieldMessage id={`${id}-msg`} message={message} />
    </div>
  );
}

interface ToggleProps {
  label: string;
  checked: boolean;
  onChange: Commit<boolean>;
  hint?: string | undefined;
  /** Marks a toggle that brings a hazard with it (drawn with the hazard edge when on). */
  hazard?: boolean | undefined;
  testId?: string | undefined;
}

/**
 * An on/off switch with a large touch target.
 *
 * @example <Toggle label="Totally enclosed fixture" checked={false} onChange={save} /> //=> a switch; a tap calls save(true)
 */
export function Toggle(props: ToggleProps) {
  const id = useId();
  const [message, setMessage] = useState<string | null>(null);
  return (
    <div class={`toggle ${props.hazard && props.checked ? 'toggle--hazard' : ''}`}>
      <input
        id={id}
        type="checkbox"
        role="switch"
        checked={props.checked}
        aria-describedby={[props.hint ? `${id}-hint` : '', `${id}-msg`].filter(Boolean).join(' ')}
        onChange={(event) => {
          const refused = props.onChange((event.currentTarget as HTMLInputElement).checked);
          setMessage(typeof refused === 'string' ? refused : null);
        }}
        data-testid={props.testId}
      />
      <label for={id}>
        <span class="toggle-track" aria-hidden="true">
          <span class="toggle-thumb" />
        </span>
        <span class="toggle-text">{props.label}</span>
      </label>
      {props.hint && (
        <p class="field-hint" id={`${id}-hint`}>
          {props.hint}
        </p>
      )}
      <FieldMessage id={`${id}-msg`} message={message} />
    </div>
  );
}

interface StepperProps {
  label: string;
  value: number;
  min: number;
  max: number;
  locale: string;
  onChange: Commit<number>;
  /** Bigger buttons for the fixture count. */
  large?: boolean | undefined;
  testId?: string | undefined;
}

/**
 * A whole number with − and + buttons either side (the fixture count).
 *
 * @example <Stepper label="Fixtures" value={12} min={0} max={100000} locale="en-US" onChange={save} /> //=> "+" calls save(13)
 */
export function Stepper(props: StepperProps) {
  const [message, setMessage] = useState<string | null>(null);
  const step = (by: number) => {
    const next = Math.min(props.max, Math.max(props.min, props.value + by));
    if (next === props.value) return;
    const refused = props.onChange(next);
    setMessage(typeof refused === 'string' ? refused : null);
  };
  return (
    <div class={`stepper ${props.large ? 'stepper--large' : ''}`} role="group" aria-label={props.label}>
      <button type="button" class="stepper-button" onClick={() => step(-1)} disabled={props.value <= props.min} aria-label={`${props.label}: one fewer`} data-testid={props.testId ? `${props.testId}-minus` : undefined}>
        <Icon name="minus" size={props.large ? 28 : 22} />
      </button>
      <NumberField
        label={props.label}
        value={props.value}
        rule={{ min: props.min, max: props.max, integer: true }}
        locale={props.locale}
        onChange={(value) => (value === undefined ? 'Enter a number.' : props.onChange(value))}
        class="stepper-field"
        {...(props.testId ? { testId: props.testId } : {})}
      />
      <button type="button" class="stepper-button" onClick={() => step(1)} disabled={props.value >= props.max} aria-label={`${props.label}: one more`} data-testid={props.testId ? `${props.testId}-plus` : undefined}>
        <Icon name="plus" size={props.large ? 28 : 22} />
      </button>
      {message && <p class="field-message">{message}</p>}
    </div>
  );
}

interface ChoiceProps<K extends string> {
  legend: string;
  value: K;
  options: readonly { value: K; label: string }[];
  onChange: Commit<K>;
  name: string;
  testId?: string | undefined;
}

/**
 * A few choices side by side (dry / damp / wet).
 *
 * @example <Choice legend="Location" name="loc" value="dry" options={options} onChange={save} /> //=> radio buttons drawn side by side
 */
export function Choice<K extends string>(props: ChoiceProps<K>) {
  const [message, setMessage] = useState<string | null>(null);
  return (
    <fieldset class="choice" data-testid={props.testId}>
      <legend>{props.legend}</legend>
      <div class="choice-options">
        {props.options.map((option) => (
          <label key={option.value} class={`choice-option ${option.value === props.value ? 'is-on' : ''}`}>
            <input
              type="radio"
              name={props.name}
              value={option.value}
              checked={option.value === props.value}
              onChange={() => {
                const refused = props.onChange(option.value);
                setMessage(typeof refused === 'string' ? refused : null);
              }}
            />
            <span>{option.label}</span>
          </label>
        ))}
      </div>
      {message && <p class="field-message">{message}</p>}
    </fieldset>
  );
}
