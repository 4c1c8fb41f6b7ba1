/**
 * Bringing a backup file in: the file is checked and previewed first (what
 * it holds, what is already here), then the user chooses to add it as a copy
 * or to replace what is here (the replaced surveys go to the trash), and only
 * then is it written — in one transaction, whole or not at all.
 */
import { useId, useState } from 'preact/hooks';
import { checkBackupSize } from '../../survey/backup.ts';
import type { ClashChoice, ImportPreview, ImportReport } from '../../survey/store.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { Icon } from './Icon.tsx';

interface Pending {
  fileName: string;
  text: string;
  preview: ImportPreview;
}

function plural(count: number, word: string): string {
  return `${count} ${word}${count === 1 ? '' : 's'}`;
}

/**
 * Open a backup file: preview, choose copy or replace, then bring it in.
 *
 * @example <BackupImport onImported={refresh} /> //=> a file button; after a file, its preview and the choice
 */
export function BackupImport(props: { onImported: (report: ImportReport) => Promise<void> | void; label?: string }) {
  const { store, notify } = useApp();
  const inputId = useId();
  const [pending, setPending] = useState<Pending | null>(null);
  const [choice, setChoice] = useState<ClashChoice>('copy');
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const pick = async (event: Event) => {
    const input = event.currentTarget as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    setProblem(null);
    setBusy(true);
    try {
      // Checked before the file is read: a huge file is never loaded into memory.
      checkBackupSize(file.size);
      const text = await file.text();
      setPending({ fileName: file.name, text, preview: await store.previewImport(text) });
    } catch (error) {
      setPending(null);
      setProblem(messageOf(error));
    } finally {
      setBusy(false);
    }
  };

  const commit = async () => {
    if (!pending) return;
    setBusy(true);
    try {
      const report = await store.importBackup(pending.text, pending.preview.needsChoice ? choice : 'refuse');
      setPending(null);
      notify({ tone: 'info', text: `Brought in ${plural(report.surveyIds.length, 'survey')}, ${report.entries} fixture ${report.entries === 1 ? 'entry' : 'entries'} and ${plural(report.photos, 'photo')}.` });
      await props.onImported(report);
    } catch (error) {
      setProblem(messageOf(error));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div class="backup-import">
      <input id={inputId} class="visually-hidden" type="file" accept=".json,application/json" onChange={pick} disabled={busy} data-testid="backup-file" />
      <label class="button button--quiet file-button" for={inputId}>
        <Icon name="fileIn" />
        {props.label ?? 'Open a backup file'}
      </label>
      {busy && !pending && <p role="status">Checking the file…</p>}
      {problem && (
        <p class="field-message" role="alert">
          {problem}
        </p>
      )}
      {pending && (
        <div class="preview-card" role="group" aria-label={`What ${pending.fileName} holds`}>
          <h3>{pending.fileName}</h3>
          <ul class="plain-list">
            {pending.preview.surveys.map((survey) => (
              <li key={survey.id}>
                <strong>{survey.name || 'Untitled survey'}</strong>: {plural(survey.rooms, 'room')}, {survey.entries} fixture entries, {plural(survey.photos, 'photo')}
                {survey.alreadyStored && <span class="tag tag--caution">already here</span>}
              </li>
            ))}
          </ul>
          <p class="quiet">
            {plural(pending.preview.catalogProducts, 'catalog product')}
            {pending.preview.catalogDiffering > 0 && `, ${pending.preview.catalogDiffering} differing from yours`}.
          </p>
          {pending.preview.needsChoice && (
            <fieldset class="choice">
              <legend>Some of this is already on this device</legend>
              <div class="choice-options choice-options--stack">
                <label class={`choice-option ${choice === 'copy' ? 'is-on' : ''}`}>
                  <input type="radio" name={`${inputId}-choice`} checked={choice === 'copy'} onChange={() => setChoice('copy')} />
                  <span>Keep both: add the file’s surveys as copies</span>
                </label>
                <label class={`choice-option ${choice === 'replace' ? 'is-on' : ''}`}>
                  <input type="radio" name={`${inputId}-choice`} checked={choice === 'replace'} onChange={() => setChoice('replace')} />
                  <span>Replace: the versions here go to Recently deleted</span>
                </label>
              </div>
            </fieldset>
          )}
          <div class="actions">
            <button type="button" class="button button--primary" onClick={commit} disabled={busy} data-testid="backup-import-commit">
              Bring it in
            </button>
            <button type="button" class="button button--quiet" onClick={() => setPending(null)} disabled={busy}>
              Cancel
            </button>
          </div>
        </div>
      )}
    </div>
  );
}
