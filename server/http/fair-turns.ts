/**
 * Fair turns for synchronous work that many requests would otherwise run back to back.
 *
 * Searches (and the cached archive list) first wait for one shared catch-up with the search change log
 * (`searchEngine.settled()`); when it ends, every waiting request continues in the same microtask drain. At 200
 * connections that was a second or more of synchronous work in one turn of the event loop, during which the process
 * accepted no connection and read no request: a connection opened meanwhile waited in the kernel's accept queue, and
 * its first request could take many seconds though no handler took more than a few milliseconds (issue 16, point 7).
 *
 * `fairTurn()` makes callers wait in arrival order and lets them go a few per turn, from `setImmediate`, which runs
 * after the loop's poll phase, so new connections are accepted and new requests read in between. How many go per
 * turn adapts to what they cost: as many as fit in SLICE_MS by the last turns' measure (at least one, at most
 * MAX_BATCH). A caller alone pays one turn of the loop (microseconds). Nothing here is shared state another server
 * needs: it is only the order in which this process runs its own work.
 */
const SLICE_MS = 8;
const MAX_BATCH = 64;

const waiting: Array<() => void> = [];
let draining = false;
let batch = 1;
let lastDrainAt = 0;
let lastBatch = 0;

function drain() {
  const now = performance.now();
  // The time since the previous drain is what the callers let go then cost, with the poll phase in between.
  if (lastBatch) {
    const perCaller = Math.max(0.001, (now - lastDrainAt) / lastBatch);
    batch = Math.max(1, Math.min(MAX_BATCH, Math.floor(SLICE_MS / perCaller)));
  }
  const n = Math.min(batch, waiting.length);
  for (let i = 0; i < n; i++) waiting.shift()!();
  lastDrainAt = now;
  lastBatch = n;
  if (waiting.length) setImmediate(drain);
  else {
    draining = false;
    lastBatch = 0;
  }
}

/** Resolves on a coming turn of the event loop, in arrival order, a few callers per turn. */
export function fairTurn(): Promise<void> {
  return new Promise((resolve) => {
    waiting.push(resolve);
    if (!draining) {
      draining = true;
      setImmediate(drain);
    }
  });
}

/** How many callers wait for a turn (for /api/health and tests). */
export function fairTurnBacklog() {
  return waiting.length;
}
