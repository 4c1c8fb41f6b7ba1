/**
 * Bringing a fixture schedule (CSV from a spreadsheet) into a room: choose
 * the file, see every row and every problem with its row number, then add
 * them — all in one transaction, or nothing.
 */
import { useId, useRef, useState } from 'preact/hooks';
import type { SchedulePreview } from '../../export/schedule.ts';
import type { CatalogProduct } from '../../survey/model.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import type { SurveySession } from '../state/session.ts';
import { Toggle } from './fields.tsx';
import { Icon } from './Icon.tsx';

interface Loaded {
  fileName: string;
  preview: SchedulePreview;
}

/**
 * A fixture schedule CSV into a room: preview, then add in one step.
 *
 * @example <ScheduleImport session={session} roomId={room.id} catalog={catalog} volts={120} /> //=> a file button; after a file, its rows
 */
export function ScheduleImport(props: { session: SurveySession; roomId: string; catalog: readonly CatalogProduct[]; volts: number }) {
  const { preferences, notify } = useApp();
  const inputId = useId();
  const [loaded, setLoaded] = useState<Loaded | null>(null);
  const [busy, setBusy] = useState(false);
  const [skipBad, setSkipBad] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const controller = useRef<AbortController | null>(null);

  const pick = async (event: Event) => {
    const input = event.currentTarget as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    setProblem(null);
    setBusy(true);
    controller.current = new AbortController();
    try {
      const { scheduleMaxFileBytes, scheduleTooLargeMessage } = await import('../../export/schedule.ts');
      // Checked before the file is read: a huge file is never loaded into memory.
      if (file.size > scheduleMaxFileBytes) {
        setProblem(`${file.name}: ${scheduleTooLargeMessage}.`);
        return;
      }
      const text = await file.text();
      const { previewSchedule } = await import('../../export/index.ts');
      const preview = await previewSchedule(controller.current.signal, text, {
        catalog: props.catalog,
        defaultCircuitVolts: props.volts,
        decimalSeparator: preferences.csvDecimal,
      });
      setLoaded({ fileName: file.name, preview });
      setSkipBad(false);
    } catch (error) {
      if (!(error instanceof DOMException && error.name === 'AbortError')) setProblem(messageOf(error));
    } finally {
      setBusy(false);
    }
  };

  const commit = async () => {
    if (!loaded) return;
    setBusy(true);
    try {
      const { commitRows } = await import('../../export/index.ts');
      const entries = commitRows(loaded.preview, { skipBadRows: skipBad });
      const added = await props.session.addEntries(props.roomId, entries);
      notify({ tone: 'info', text: `Added ${added.length} fixture ${added.length === 1 ? 'entry' : 'entries'} from ${loaded.fileName}.` });
      setLoaded(null);
    } catch (error) {
      setProblem(messageOf(error));
    } finally {
      setBusy(false);
    }
  };

  const preview = loaded?.preview;
  const good = preview ? preview.rows.filter((row) => row.problems.length === 0 && row.entry).length : 0;
  const blocked = !preview || preview.fileProblems.length > 0 || good === 0 || (preview.badRows > 0 && !skipBad);
  return (
    <div class="schedule-import">
      <input id={inputId} class="visually-hidden" type="file" accept=".csv,text/csv" onChange={pick} disabled={busy} data-testid="schedule-file" />
      <label class="button button--quiet file-button" for={inputId}>
        <Icon name="fileIn" />
        Add from a spreadsheet (CSV)
      </label>
      {busy && !loaded && (
        <p role="status">
          Reading the file…{' '}
          <button type="button" class="button button--quiet" onClick={() => controller.current?.abort()}>
            Cancel
          </button>
        </p>
      )}
      {problem && (
        <p class="field-message" role="alert">
          {problem}
        </p>
      )}
      {loaded && preview && (
        <div class="preview-card" data-testid="schedule-preview">
          <h3>{loaded.fileName}</h3>
          {preview.fileProblems.length > 0 && (
            <ul class="plain-list problems" role="alert">
              {preview.fileProblems.map((text) => (
                <li key={text}>{text}</li>
              ))}
            </ul>
          )}
          {preview.unmappedHeaders.length > 0 && <p class="quiet">Columns not used: {preview.unmappedHeaders.join(', ')}.</p>}
          {preview.rows.length > 0 && (
            <div class="table-wrap">
              <table>
                <caption class="visually-hidden">Rows of {loaded.fileName}</caption>
                <thead>
                  <tr>
                    <th scope="col">Row</th>
                    <th scope="col">Count</th>
                    <th scope="col">Now</th>
                    <th scope="col">Swap to</th>
                    <th scope="col">Problems</th>
                  </tr>
                </thead>
                <tbody>
                  {preview.rows.slice(0, 200).map((row) => (
                    <tr key={row.rowNumber} class={row.problems.length > 0 ? 'row-bad' : ''}>
                      <th scope="row">{row.rowNumber}</th>
                      <td>{row.entry?.count ?? '—'}</td>
                      <td>{row.entry?.existing.description ?? '—'}</td>
                      <td>{row.entry?.proposed?.name ?? '—'}</td>
                      <td>{row.problems.map((p) => `${p.column ? `${p.column}: ` : ''}${p.message}`).join('; ') || 'none'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              {preview.rows.length > 200 && <p class="quiet">and {preview.rows.length - 200} more rows.</p>}
            </div>
          )}
          <p>
            {good} row{good === 1 ? '' : 's'} ready, {preview.badRows} with problems.
          </p>
          {preview.badRows > 0 && preview.fileProblems.length === 0 && good > 0 && <Toggle label="Leave out the rows with problems" checked={skipBad} onChange={setSkipBad} />}
          <div class="actions">
            <button type="button" class="button button--primary" onClick={commit} disabled={blocked || busy} data-testid="schedule-commit">
              Add {skipBad ? good : preview.rows.length} to this room
            </button>
            <button type="button" class="button button--quiet" onClick={() => setLoaded(null)}>
              Cancel
            </button>
          </div>
        </div>
      )}
    </div>
  );
}
