/**
 * A wake-up call for the delivery loop when something new is queued, so a notice goes out seconds after it
 * is issued instead of at the next timer tick. Issuing happens inside the caller's transaction, so the call
 * is deferred to the next turn of the event loop: by then the (synchronous) transaction has committed or
 * rolled back, and a loop woken for a rolled-back notice just finds nothing to do.
 */
const listeners = new Set<() => void>();

export function onDeliveriesQueued(listener: () => void): () => void {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

export function deliveriesQueued(): void {
  setImmediate(() => {
    for (const listener of listeners) listener();
  });
}
