/** The progress bar and Cancel button shown while a document is made. */
import { useId } from 'preact/hooks';
import type { ExportJob } from '../state/exportJob.ts';
import { Icon } from './Icon.tsx';

/**
 * The running job's progress with a Cancel button that aborts it.
 *
 * @example <ExportProgress job={job} cancelTestId="export-cancel" /> //=> "Making the Order list (PDF)…", a progress bar, Cancel
 */
export function ExportProgress(props: { job: ExportJob; cancelTestId?: string }) {
  const progressId = useId();
  const { job } = props;
  return (
    <div class="export-progress" role="status">
      <label for={progressId}>Making the {job.label}…</label>
      <progress id={progressId} max={1} value={job.progress} />
      <button type="button" class="button button--quiet" onClick={() => job.controller.abort()} data-testid={props.cancelTestId}>
        <Icon name="close" />
        Cancel
      </button>
    </div>
  );
}
