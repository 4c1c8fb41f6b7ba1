/**
 * Making one document at a time from an export button: the job on screen
 * (label, progress, its AbortController), handing the file over (share sheet
 * or download) and telling the user how it went. Shared by the survey's and
 * the portfolio's export buttons.
 */
import { useState } from 'preact/hooks';
import type { ExportedFile } from '../../export/types.ts';
import { useApp } from './context.ts';
import { messageOf } from './errors.ts';
import type { Preferences } from './preferences.ts';
import { deliver } from './share.ts';

/** The document being made. */
export interface ExportJob {
  label: string;
  /** 0 to 1. */
  progress: number;
  controller: AbortController;
}

function isAbort(error: unknown): boolean {
  return typeof error === 'object' && error !== null && 'name' in error && (error as { name: unknown }).name === 'AbortError';
}

/**
 * The company block of the documents from the preferences; `fallbackName`
 * when no company name is set.
 *
 * @example companyOf({ ...preferences, companyName: '' }, 'Lampwalk').companyName //=> 'Lampwalk'
 */
export function companyOf(preferences: Preferences, fallbackName: string) {
  const details = preferences.companyDetails
    .split('\n')
    .map((line) => line.trim())
    .filter(Boolean);
  return {
    companyName: preferences.companyName || fallbackName,
    ...(preferences.logo ? { logo: preferences.logo } : {}),
    ...(details.length > 0 ? { companyDetails: details } : {}),
  };
}

/**
 * The CSV format the user chose: semicolons and decimal commas, or commas and decimal points.
 *
 * @example csvFormatOf({ ...preferences, csvDecimal: ',' }) //=> { delimiter: ';', decimalSeparator: ',' }
 */
export function csvFormatOf(preferences: Pick<Preferences, 'csvDecimal'>) {
  return preferences.csvDecimal === ',' ? ({ delimiter: ';', decimalSeparator: ',' } as const) : ({ delimiter: ',', decimalSeparator: '.' } as const);
}

/**
 * One export at a time: `run(label, make)` shows the job, passes `make` the
 * job's abort signal and a progress callback, hands the file over and
 * notifies "ready", "cancelled" or why it could not be made. Ignored while
 * another job runs.
 *
 * @example const { job, run } = useExportJob(); run('Order list (CSV)', (signal, onProgress) => exporter.run(signal, input, options, onProgress))
 */
export function useExportJob(): {
  job: ExportJob | null;
  run: (label: string, make: (signal: AbortSignal, onProgress: (fraction: number) => void) => Promise<ExportedFile>) => Promise<void>;
} {
  const { notify } = useApp();
  const [job, setJob] = useState<ExportJob | null>(null);

  const run = async (label: string, make: (signal: AbortSignal, onProgress: (fraction: number) => void) => Promise<ExportedFile>) => {
    if (job) return;
    const controller = new AbortController();
    setJob({ label, progress: 0, controller });
    try {
      const file = await make(controller.signal, (progress) =>
        setJob((current) => (current && current.controller === controller ? { ...current, progress } : current)),
      );
      if (controller.signal.aborted) throw new DOMException('cancelled', 'AbortError');
      const how = await deliver(file);
      if (how !== 'cancelled') notify({ tone: 'info', text: `${label} ready: ${file.fileName}.` });
    } catch (error) {
      if (isAbort(error)) notify({ tone: 'info', text: `${label}: cancelled.` });
      else notify({ tone: 'error', text: `${label} could not be made. ${messageOf(error)}` });
    } finally {
      setJob(null);
    }
  };

  return { job, run };
}
