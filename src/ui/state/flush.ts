/**
 * Every autosave queue of the open screens, so one call can wait for all
 * pending edits to be written (the service-worker update waits for this
 * before it reloads the page: an entry being typed is never lost).
 */
import type { SaveQueue } from './queue.ts';

const queues = new Set<SaveQueue>();

/**
 * Adds a queue to those `flushPendingEdits` waits for; returns the function that removes it.
 *
 * @example const forget = registerQueue(queue) //=> flushPendingEdits() now waits for queue
 */
export function registerQueue(queue: SaveQueue): () => void {
  queues.add(queue);
  return () => queues.delete(queue);
}

/**
 * Resolves when every edit made so far on any screen has been written (or
 * has failed; a failure is shown by the screen that made it).
 *
 * @example await flushPendingEdits() //=> undefined, once the autosave queues are idle
 */
export async function flushPendingEdits(): Promise<void> {
  await Promise.all([...queues].map((queue) => queue.idle()));
}
