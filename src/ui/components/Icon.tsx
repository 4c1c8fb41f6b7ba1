/**
 * Lampwalk's own line icons, drawn on a 24 × 24 grid with round strokes.
 * Decorative by default (hidden from screen readers): the button or link
 * around an icon carries the words.
 */
import type { JSX } from 'preact';

const paths = {
  lamp: (
    <>
      <path d="M12 2v4" />
      <path d="M7.5 6h9l2.5 6H5z" />
      <path d="M9.5 12a2.5 2.5 0 0 0 5 0" />
      <path d="M4 17l-1.5 1.5M20 17l1.5 1.5M12 17.5V21" />
    </>
  ),
  plus: <path d="M12 5v14M5 12h14" />,
  minus: <path d="M5 12h14" />,
  back: <path d="M15 5l-7 7 7 7" />,
  next: <path d="M9 5l7 7-7 7" />,
  repeat: (
    <>
      <path d="M4 11V9a3 3 0 0 1 3-3h12l-3-3" />
      <path d="M20 13v2a3 3 0 0 1-3 3H5l3 3" />
    </>
  ),
  camera: (
    <>
      <path d="M3 8.5A1.5 1.5 0 0 1 4.5 7h3L9 4.5h6L16.5 7h3A1.5 1.5 0 0 1 21 8.5v9a1.5 1.5 0 0 1-1.5 1.5h-15A1.5 1.5 0 0 1 3 17.5z" />
      <circle cx="12" cy="13" r="3.5" />
    </>
  ),
  trash: (
    <>
      <path d="M4 7h16M10 3h4M6 7l1 13h10l1-13" />
      <path d="M10 11v5M14 11v5" />
    </>
  ),
  undo: (
    <>
      <path d="M9 14L4 9l5-5" />
      <path d="M4 9h10a6 6 0 0 1 0 12h-3" />
    </>
  ),
  download: (
    <>
      <path d="M12 3v12M7 10l5 5 5-5" />
      <path d="M4 17v3h16v-3" />
    </>
  ),
  share: (
    <>
      <path d="M12 15V3M7.5 7.5L12 3l4.5 4.5" />
      <path d="M8 11H5v10h14V11h-3" />
    </>
  ),
  fileIn: (
    <>
      <path d="M14 3H6v18h12V7z" />
      <path d="M14 3v4h4M12 10v7M9 14l3 3 3-3" />
    </>
  ),
  gear: (
    <>
      <path d="M4 6h9M17 6h3M4 12h3M11 12h9M4 18h11M19 18h1" />
      <circle cx="15" cy="6" r="2" />
      <circle cx="9" cy="12" r="2" />
      <circle cx="17" cy="18" r="2" />
    </>
  ),
  box: (
    <>
      <path d="M3 7.5L12 3l9 4.5v9L12 21l-9-4.5z" />
      <path d="M3 7.5L12 12l9-4.5M12 12v9" />
    </>
  ),
  door: (
    <>
      <path d="M5 21V3h11v18M3 21h18" />
      <path d="M13 12h.01" />
    </>
  ),
  list: <path d="M8 6h12M8 12h12M8 18h12M4 6h.01M4 12h.01M4 18h.01" />,
  check: <path d="M5 12.5l4.5 4.5L19 7.5" />,
  close: <path d="M6 6l12 12M18 6L6 18" />,
  hazard: (
    <>
      <path d="M8.2 3h7.6L21 8.2v7.6L15.8 21H8.2L3 15.8V8.2z" />
      <path d="M12 7.5v5.5M12 16.5h.01" />
    </>
  ),
  rethink: (
    <>
      <path d="M12 3.5L22 20H2z" />
      <path d="M12 10v4.5M12 17.5h.01" />
    </>
  ),
  note: (
    <>
      <circle cx="12" cy="12" r="9" />
      <path d="M12 11v5.5M12 7.5h.01" />
    </>
  ),
  bolt: <path d="M13 2L5 13h6l-1 9 8-11h-6z" />,
  sun: (
    <>
      <circle cx="12" cy="12" r="4" />
      <path d="M12 2v2.5M12 19.5V22M2 12h2.5M19.5 12H22M4.9 4.9l1.8 1.8M17.3 17.3l1.8 1.8M4.9 19.1l1.8-1.8M17.3 6.7l1.8-1.8" />
    </>
  ),
  moon: <path d="M20 14.5A8 8 0 1 1 9.5 4a6.5 6.5 0 0 0 10.5 10.5z" />,
  copy: (
    <>
      <path d="M8 8h12v12H8z" />
      <path d="M16 8V4H4v12h4" />
    </>
  ),
} satisfies Record<string, JSX.Element>;

export type IconName = keyof typeof paths;

/**
 * One of Lampwalk's icons, hidden from screen readers unless given a label.
 *
 * @example <Icon name="plus" /> //=> <svg class="icon" aria-hidden="true">…</svg>
 */
export function Icon(props: { name: IconName; size?: number; label?: string }) {
  const size = props.size ?? 24;
  const labelled = props.label !== undefined;
  return (
    <svg
      class="icon"
      width={size}
      height={size}
      viewBox="0 0 24 24"
      fill="none"
      stroke="currentColor"
      stroke-width="2"
      stroke-linecap="round"
      stroke-linejoin="round"
      aria-hidden={labelled ? undefined : 'true'}
      role={labelled ? 'img' : undefined}
      aria-label={props.label}
      focusable="false"
    >
      {paths[props.name]}
    </svg>
  );
}
