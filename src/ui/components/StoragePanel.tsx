/**
 * Where the data lives and how safe it is: whether the browser promised to
 * keep it, how much space it takes, and how long since the last backup —
 * with a nudge to back up when it has been a while.
 */
import { useEffect, useState } from 'preact/hooks';
import type { BackupStatus, StorageUsage } from '../../survey/store.ts';
import { useApp } from '../state/context.ts';
import { messageOf } from '../state/errors.ts';
import { deliver } from '../state/share.ts';
import { Icon } from './Icon.tsx';

interface Facts {
  backup: BackupStatus;
  usage: StorageUsage | null;
  persisted: boolean | null;
}

function megabytes(bytes: number, locale: string): string {
  const format = new Intl.NumberFormat(locale, { maximumFractionDigits: 1 });
  return bytes < 1_000_000 ? `${format.format(bytes / 1000)} kB` : `${format.format(bytes / 1_000_000)} MB`;
}

/**
 * Backup state, storage promise and space used, with the backup button.
 *
 * @example <StoragePanel refreshKey={0} /> //=> the facts and "Back up everything"
 */
export function StoragePanel(props: { refreshKey: number }) {
  const { store, notify, preferences } = useApp();
  const [facts, setFacts] = useState<Facts | null>(null);
  const [busy, setBusy] = useState(false);

  const refresh = async () => {
    const [backup, usage, settings] = await Promise.all([store.backupStatus(), store.storageUsage(), store.settings()]);
    let persisted = settings?.persistence?.granted ?? null;
    if (persisted === null && typeof navigator !== 'undefined' && navigator.storage?.persisted) {
      persisted = await navigator.storage.persisted().catch(() => null);
    }
    setFacts({ backup, usage, persisted });
  };

  useEffect(() => {
    refresh().catch((error: unknown) => notify({ tone: 'error', text: messageOf(error) }));
  }, [props.refreshKey]);

  const backUp = async () => {
    setBusy(true);
    try {
      const backup = await store.exportEverything();
      const how = await deliver({ fileName: backup.fileName, mimeType: 'application/json', bytes: backup.text });
      notify({ tone: 'info', text: how === 'cancelled' ? 'Backup not shared.' : `Backup ready: ${backup.fileName}. Keep it somewhere other than this phone.` });
      await refresh();
    } catch (error) {
      notify({ tone: 'error', text: messageOf(error) });
    } finally {
      setBusy(false);
    }
  };

  if (!facts) return <p class="quiet">Checking storage…</p>;
  const { backup, usage, persisted } = facts;
  const since = backup.lastBackupAt === null ? 'No backup yet' : `Last backup ${backup.timeSinceBackup} ago`;
  return (
    <div class={`storage ${backup.remind ? 'storage--remind' : ''}`} data-testid="storage-panel">
      {backup.remind && (
        <p class="nudge">
          <Icon name="rethink" size={20} />
          <span>
            <strong>Time for a backup.</strong> A phone can lose a browser’s data; a backup file kept elsewhere brings everything back.
          </span>
        </p>
      )}
      <dl class="facts">
        <div>
          <dt>Backup</dt>
          <dd>
            {since}; {backup.editsSinceBackup} change{backup.editsSinceBackup === 1 ? '' : 's'} since.
          </dd>
        </div>
        <div>
          <dt>Kept by the browser</dt>
          <dd>
            {persisted === true
              ? 'Yes: kept even when space runs low.'
              : persisted === false
                ? 'Not promised: the browser may clear it when space runs low. Install Lampwalk to the home screen and back up often.'
                : 'Asked on the first save.'}
          </dd>
        </div>
        {usage && (
          <div>
            <dt>Space used</dt>
            <dd>
              {megabytes(usage.usageBytes, preferences.locale)} of {megabytes(usage.quotaBytes, preferences.locale)} allowed
            </dd>
          </div>
        )}
      </dl>
      <button type="button" class={`button ${backup.remind ? 'button--primary' : ''}`} onClick={backUp} disabled={busy} data-testid="backup-everything">
        <Icon name="download" />
        Back up everything
      </button>
    </div>
  );
}
