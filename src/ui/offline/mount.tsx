/**
 * Temporary mount of the offline status and the install hint, loaded by its
 * own script tag in `index.html` until they are rendered inside the app
 * (then this file and the tag go). Its flush waits for the screens' autosave
 * queues as well as for its own handle's edits.
 *
 * It also keeps a small handle on `window.lampwalkOffline` through which the
 * browser tests (`tests/offline`) create surveys, make edits that are still
 * being saved when an update is accepted, and load the export code with no
 * signal, before the screens provide those actions themselves.
 */
import { render } from 'preact';
import type { SurveyResult } from '../../calc/survey.ts';
import type { Survey } from '../../survey/model.ts';
import { openSurveyStore, type SurveyStore } from '../../survey/store.ts';
import { flushPendingEdits as flushScreenEdits } from '../state/flush.ts';
import { buildId } from './build.ts';
import { InstallHint } from './InstallHint.tsx';
import { OfflineStatus } from './OfflineStatus.tsx';

/** Edits started through the handle and not yet saved. */
const pending = new Set<Promise<unknown>>();

/** Resolves once every edit started so far is saved; rejects with the first failure. */
async function flushPendingEdits(): Promise<void> {
  while (pending.size > 0) {
    const results = await Promise.allSettled([...pending]);
    const failed = results.find((result): result is PromiseRejectedResult => result.status === 'rejected');
    if (failed) throw failed.reason instanceof Error ? failed.reason : new Error(String(failed.reason));
  }
  // The screens' autosave queues: an entry being typed is written before the update reloads the page.
  await flushScreenEdits();
  if (store) await (await store).whenIdle();
}

let store: Promise<SurveyStore> | null = null;

/** What the browser tests reach on `window.lampwalkOffline`. */
export interface OfflineHandle {
  buildId: string;
  /** The survey store (its own connection to the app's database). */
  store(): Promise<SurveyStore>;
  /** Runs `edit` as a pending edit: the update action waits for it. */
  edit<T>(edit: (store: SurveyStore) => Promise<T>): Promise<T>;
  /** `calculateSurvey`, loaded on demand (the first screen does not need it). */
  calculate(survey: Survey): Promise<SurveyResult>;
  /** The export code, loaded on demand as the app does. */
  exportCode(): Promise<typeof import('../../export/index.ts')>;
}

const handle: OfflineHandle = {
  buildId,
  store: () => (store ??= openSurveyStore()),
  edit(edit) {
    const saving = handle.store().then(edit);
    pending.add(saving);
    const forget = () => pending.delete(saving);
    saving.then(forget, forget);
    return saving;
  },
  calculate: async (survey) => (await import('../../calc/survey.ts')).calculateSurvey(survey),
  exportCode: () => import('../../export/index.ts'),
};
(window as Window & { lampwalkOffline?: OfflineHandle }).lampwalkOffline = handle;

const container = document.getElementById('offline-ui');
if (container) {
  render(
    <>
      <InstallHint />
      <OfflineStatus flushPendingEdits={flushPendingEdits} />
    </>,
    container,
  );
}
