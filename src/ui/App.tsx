/**
 * First screen: opens the survey store (seeding the example catalog and the
 * demo survey on first run), then shows the most recently changed stored
 * survey's headline figures and warnings, straight from the calculation
 * engine. Also says plainly when the browser deleted the saved data, when
 * another tab is in the way, and how long since the last backup. The field
 * screens replace the survey view.
 */
import { useEffect, useState } from 'preact/hooks';
import { calculateSurvey, type SurveyResult } from '../calc/survey.ts';
import { formatMoney, formatNumber, luxToFootcandles } from '../calc/units.ts';
import type { Warning } from '../calc/warnings.ts';
import type { Survey } from '../survey/model.ts';
import {
  StoreError,
  startLampwalk,
  type BackupStatus,
  type ClashChoice,
  type ClosedReason,
  type StorageUsage,
  type SurveyStore,
} from '../survey/store.ts';

function describeIrr(result: SurveyResult): string {
  const irr = result.economics.internalRateOfReturn;
  if (irr.kind === 'unique') return `${formatNumber(irr.ratePerYear * 100, 'en-US', 1)} %`;
  if (irr.kind === 'multiple') return 'several rates (see report)';
  return 'none';
}

function Figure(props: { label: string; value: string }) {
  return (
    <div class="figure">
      <dt>{props.label}</dt>
      <dd>{props.value}</dd>
    </div>
  );
}

function WarningItem(props: { warning: Warning }) {
  const w = props.warning;
  return (
    <li class={`warning warning--${w.severity}`}>
      <strong>
        <span class="severity">{w.severity}</span> {w.title}
      </strong>
      <p>{w.message}</p>
      <p class="action">{w.action}</p>
    </li>
  );
}

function SurveyView(props: { survey: Survey; result: SurveyResult }) {
  const { survey, result } = props;
  const { locale } = survey;
  const money = (n: number) => formatMoney(n, result.currency, locale, 0);
  const t = result.totals;
  const payback = t.money.simplePaybackYears;
  return (
    <>
      <section aria-labelledby="totals-heading">
        <h2 id="totals-heading">What the swap does</h2>
        <dl class="figures">
          <Figure label="Energy saved" value={`${formatNumber(t.savings.kwhPerYear, locale)} kWh/yr`} />
          <Figure label="Demand saved (peak)" value={`${formatNumber(t.savings.peakKw, locale, 2)} kW`} />
          <Figure label="Money saved" value={`${money(t.money.totalPerYear)}/yr`} />
          <Figure label="Project cost, net of rebates" value={money(t.money.cost.net)} />
          <Figure label="Simple payback" value={payback === null ? 'never' : `${formatNumber(payback, locale, 1)} years`} />
          <Figure label={`NPV over ${survey.money.analysisYears} years`} value={money(result.economics.netPresentValue)} />
          <Figure label="IRR" value={describeIrr(result)} />
          <Figure label="CO2 avoided" value={`${formatNumber(t.co2KgPerYear / 1000, locale, 2)} t/yr`} />
        </dl>
      </section>
      <section aria-labelledby="rooms-heading">
        <h2 id="rooms-heading">Rooms</h2>
        <table>
          <thead>
            <tr>
              <th scope="col">Room</th>
              <th scope="col">kWh/yr saved</th>
              <th scope="col">Light now → after (fc)</th>
              <th scope="col">Target (fc)</th>
            </tr>
          </thead>
          <tbody>
            {result.rooms.map((r) => (
              <tr key={r.roomId}>
                <th scope="row">{r.name}</th>
                <td>{formatNumber(r.savings.kwhPerYear, locale)}</td>
                <td>
                  {r.adequacy.existingLux === null ? '—' : formatNumber(luxToFootcandles(r.adequacy.existingLux), locale)} →{' '}
                  {r.adequacy.proposedLux === null ? '—' : formatNumber(luxToFootcandles(r.adequacy.proposedLux), locale)}
                </td>
                <td>{formatNumber(r.adequacy.targetFootcandles, locale)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section aria-labelledby="warnings-heading">
        <h2 id="warnings-heading">Fix before ordering ({result.warnings.length})</h2>
        <ul class="warnings">
          {result.warnings.map((w, i) => (
            <WarningItem key={`${w.code}-${w.entryId ?? w.roomId ?? i}`} warning={w} />
          ))}
        </ul>
      </section>
    </>
  );
}

/** What the screen shows. */
type Screen =
  | { kind: 'opening' }
  /** An older Lampwalk in another tab keeps the database; opening waits for it. */
  | { kind: 'blocked' }
  /** This tab must reload (updated in another tab, data deleted, or the browser closed the database). */
  | { kind: 'reload'; reason: ClosedReason }
  | { kind: 'failed'; message: string }
  /** The browser deleted the saved data. */
  | { kind: 'evicted'; store: SurveyStore; since: string | null }
  | { kind: 'ready'; store: SurveyStore; view: { survey: Survey; result: SurveyResult } | null };

/** What the "your data" panel shows. */
interface DataStatus {
  backup: BackupStatus;
  usage: StorageUsage | null;
  persisted: boolean | null;
}

/** A message fit to show for any failure (StoreError messages are written for the user). */
function messageOf(error: unknown): string {
  if (error instanceof StoreError) return error.message;
  if (error instanceof Error) return `Something went wrong: ${error.message}`;
  return 'Something went wrong.';
}

async function openNewest(store: SurveyStore): Promise<{ survey: Survey; result: SurveyResult } | null> {
  const [newest] = await store.listSurveys();
  if (!newest) return null;
  const survey = await store.loadSurvey(newest.id);
  return { survey, result: calculateSurvey(survey) };
}

function download(fileName: string, text: string): void {
  const url = URL.createObjectURL(new Blob([text], { type: 'application/json' }));
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.click();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

function formatMegabytes(bytes: number): string {
  return `${formatNumber(bytes / 1_000_000, 'en-US', 1)} MB`;
}

/** Backup, restore and storage facts, with the reminder (only the restore when `restoreOnly`). */
function DataPanel(props: { store: SurveyStore; onRestored: () => void; restoreOnly?: boolean }) {
  const { store, onRestored, restoreOnly = false } = props;
  const [status, setStatus] = useState<DataStatus | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [pending, setPending] = useState<{ text: string; names: string[] } | null>(null);

  const refresh = async () => {
    const [backup, usage, settings] = await Promise.all([store.backupStatus(), store.storageUsage(), store.settings()]);
    setStatus({ backup, usage, persisted: settings?.persistence?.granted ?? null });
  };
  useEffect(() => {
    refresh().catch((error: unknown) => setNotice(messageOf(error)));
  }, [store]);

  const backUp = async () => {
    try {
      const backup = await store.exportEverything();
      download(backup.fileName, backup.text);
      setNotice(`Backup saved as ${backup.fileName}.`);
      await refresh();
    } catch (error) {
      setNotice(messageOf(error));
    }
  };

  const restore = async (text: string, choice: ClashChoice) => {
    try {
      const report = await store.importBackup(text, choice);
      await store.initialise({ exampleCatalog: false, demoSurvey: false });
      setPending(null);
      setNotice(`Restored ${report.surveyIds.length} survey(s), ${report.entries} fixture entries and ${report.photos} photo(s).`);
      onRestored();
      await refresh();
    } catch (error) {
      setNotice(messageOf(error));
    }
  };

  const pick = async (event: Event) => {
    const input = event.currentTarget as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    try {
      const text = await file.text();
      const preview = await store.previewImport(text);
      if (preview.needsChoice) setPending({ text, names: preview.surveys.filter((s) => s.alreadyStored).map((s) => s.name) });
      else await restore(text, 'refuse');
    } catch (error) {
      setNotice(messageOf(error));
    }
  };

  const backup = restoreOnly ? undefined : status?.backup;
  return (
    <section aria-labelledby="data-heading">
      <h2 id="data-heading">{restoreOnly ? 'Restore a backup' : 'Your data on this device'}</h2>
      {backup && (
        <p>
          {backup.lastBackupAt === null ? 'No backup yet' : `Last backup ${backup.timeSinceBackup} ago`}
          {`; ${backup.editsSinceBackup} change${backup.editsSinceBackup === 1 ? '' : 's'} since.`}
          {backup.remind ? ' Download a backup now: a phone can lose its browser data.' : ''}
        </p>
      )}
      {!restoreOnly && status?.usage && (
        <p>
          Using {formatMegabytes(status.usage.usageBytes)} of {formatMegabytes(status.usage.quotaBytes)} the browser allows
          {status.persisted === true ? '; kept even when space runs low.' : status.persisted === false ? '; the browser may clear it when space runs low.' : '.'}
        </p>
      )}
      <p>
        {!restoreOnly && (
          <>
            <button type="button" onClick={backUp}>
              Download a backup
            </button>{' '}
          </>
        )}
        <label>
          Restore from a backup file <input type="file" accept=".json,application/json" onChange={pick} />
        </label>
      </p>
      {pending && (
        <div role="alertdialog" aria-label="Already on this device">
          <p>
            {pending.names.length > 0 ? `Already here: ${pending.names.join(', ')}.` : 'Some of this file is already here.'} Keep both, or
            replace what is here (it goes to the trash)?
          </p>
          <button type="button" onClick={() => restore(pending.text, 'copy')}>
            Import as a copy
          </button>{' '}
          <button type="button" onClick={() => restore(pending.text, 'replace')}>
            Replace
          </button>{' '}
          <button type="button" onClick={() => setPending(null)}>
            Cancel
          </button>
        </div>
      )}
      {notice && <p role="status">{notice}</p>}
    </section>
  );
}

export function App() {
  const [screen, setScreen] = useState<Screen>({ kind: 'opening' });

  useEffect(() => {
    let cancelled = false;
    startLampwalk({
      onBlocked: () => setScreen({ kind: 'blocked' }),
      onClosed: (reason) => setScreen({ kind: 'reload', reason }),
    })
      .then(async ({ store, state, previousUse }) => {
        if (cancelled) return;
        if (state === 'evicted') {
          setScreen({ kind: 'evicted', store, since: previousUse?.firstUsedAt ?? null });
          return;
        }
        setScreen({ kind: 'ready', store, view: await openNewest(store) });
      })
      .catch((error: unknown) => setScreen({ kind: 'failed', message: messageOf(error) }));
    return () => {
      cancelled = true;
    };
  }, []);

  const show = (store: SurveyStore) => {
    openNewest(store)
      .then((view) => setScreen({ kind: 'ready', store, view }))
      .catch((error: unknown) => setScreen({ kind: 'failed', message: messageOf(error) }));
  };

  return (
    <main>
      <header class="masthead">
        <h1>Lampwalk</h1>
        <p>{screen.kind === 'ready' && screen.view ? screen.view.survey.name : 'Room-by-room LED retrofit surveys'}</p>
      </header>
      {screen.kind === 'opening' && <p>Opening your surveys…</p>}
      {screen.kind === 'blocked' && (
        <p role="alert">Lampwalk is open in another tab with an older version. Close that tab; this one carries on by itself.</p>
      )}
      {screen.kind === 'reload' && (
        <p role="alert">
          {screen.reason === 'deleted-elsewhere'
            ? 'Lampwalk’s saved data was deleted (in another tab, or by clearing the browser’s site data).'
            : screen.reason === 'newer-version-elsewhere'
              ? 'Lampwalk was updated in another tab. Everything saved is kept.'
              : 'Lampwalk stopped reaching its saved data. Everything saved is kept.'}{' '}
          <button type="button" onClick={() => location.reload()}>
            Reload
          </button>
        </p>
      )}
      {screen.kind === 'failed' && <p role="alert">{screen.message}</p>}
      {screen.kind === 'evicted' && (
        <section aria-labelledby="evicted-heading">
          <h2 id="evicted-heading">Your saved surveys are gone</h2>
          <p role="alert">
            Lampwalk was used in this browser{screen.since ? ` since ${new Date(screen.since).toLocaleDateString()}` : ''}, but the browser
            has deleted its saved data (browsers do this when space runs low or after a long time unused). Restore your latest backup file
            below, or start again with the demo survey.
          </p>
          <p>
            <button
              type="button"
              onClick={() => {
                const { store } = screen;
                store
                  .initialise({ exampleCatalog: true, demoSurvey: true })
                  .then(() => show(store))
                  .catch((error: unknown) => setScreen({ kind: 'failed', message: messageOf(error) }));
              }}
            >
              Start again with the demo
            </button>
          </p>
          <DataPanel store={screen.store} onRestored={() => show(screen.store)} restoreOnly />
        </section>
      )}
      {screen.kind === 'ready' && (
        <>
          {screen.view ? <SurveyView survey={screen.view.survey} result={screen.view.result} /> : <p>No surveys saved yet.</p>}
          <DataPanel store={screen.store} onRestored={() => show(screen.store)} />
        </>
      )}
      <footer>
        <p>
          Estimates, not guarantees. Wiring work must follow local codes and be done by a licensed electrician.
        </p>
      </footer>
    </main>
  );
}
