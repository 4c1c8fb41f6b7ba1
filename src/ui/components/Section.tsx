/** A titled part of a screen (a panel with its own heading). */
import type { ComponentChildren } from 'preact';
import { useId } from 'preact/hooks';

/**
 * A titled group of fields or figures.
 *
 * @example <Section title="Controls">…</Section> //=> <section class="panel" aria-labelledby=…><h2>Controls</h2>…</section>
 */
export function Section(props: { title: string; children: ComponentChildren; id?: string; class?: string; headingLevel?: 2 | 3 }) {
  const headingId = useId();
  const Heading = props.headingLevel === 3 ? 'h3' : 'h2';
  return (
    <section class={`panel ${props.class ?? ''}`} aria-labelledby={headingId} id={props.id}>
      <Heading id={headingId}>{props.title}</Heading>
      {props.children}
    </section>
  );
}
