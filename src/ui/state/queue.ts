/**
 * The autosave queue: store calls run one after another, in the order the
 * user made the edits, each awaited to its commit. Edits to the same record
 * that are still waiting are merged into one call (typing "120" saves once
 * or twice, not three times), so the queue never falls behind the keyboard.
 */

/** What the save indicator shows. */
export interface QueueStatus {
  /** Calls waiting or running. */
  pending: number;
  /** The last failure's message, until the next success. */
  error: string | null;
}

interface Waiting {
  patch: Record<string, unknown>;
  promise: Promise<void>;
}

/**
 * The autosave queue (see the file comment).
 *
 * @example await new SaveQueue(String).run(() => store.updateEntry(id, { count: 3 })) //=> the saved entry
 */
export class SaveQueue {
  #tail: Promise<unknown> = Promise.resolve();
  #waiting = new Map<string, Waiting>();
  #pending = 0;
  #error: string | null = null;
  #listeners = new Set<(status: QueueStatus) => void>();

  constructor(private readonly describe: (error: unknown) => string) {}

  get status(): QueueStatus {
    return { pending: this.#pending, error: this.#error };
  }

  /** Calls `listener` on every change of status; returns the unsubscribe function. */
  subscribe(listener: (status: QueueStatus) => void): () => void {
    this.#listeners.add(listener);
    return () => this.#listeners.delete(listener);
  }

  #emit(): void {
    const status = this.status;
    for (const listener of this.#listeners) listener(status);
  }

  /** Runs `task` after everything queued before it; resolves or rejects with its outcome. */
  run<T>(task: () => Promise<T>): Promise<T> {
    this.#pending++;
    this.#emit();
    const result = this.#tail.then(task);
    this.#tail = result.then(
      () => this.#settle(null),
      (error: unknown) => this.#settle(error),
    );
    return result;
  }

  /**
   * Queues a patch of record `key`. While an earlier patch of the same record
   * is still waiting its turn, the two are merged (later fields win) and
   * saved in one call.
   */
  patch<P extends object>(key: string, patch: P, save: (merged: P) => Promise<unknown>): Promise<void> {
    const waiting = this.#waiting.get(key);
    if (waiting) {
      Object.assign(waiting.patch, patch as Record<string, unknown>);
      return waiting.promise;
    }
    const merged: Record<string, unknown> = { ...(patch as Record<string, unknown>) };
    const promise = this.run(async () => {
      this.#waiting.delete(key);
      await save(merged as P);
    });
    this.#waiting.set(key, { patch: merged, promise });
    return promise;
  }

  #settle(error: unknown): void {
    this.#pending--;
    this.#error = error === null ? null : this.describe(error);
    this.#emit();
  }

  /** Resolves once everything queued so far has been saved or has failed. */
  async idle(): Promise<void> {
    while (this.#pending > 0) await this.#tail;
  }
}
