/**
 * When plots are drawn. Starting the plotting library is one long task (0.5 to 1.9 s on a busy machine),
 * and drawing a plot is another of tens of milliseconds: neither may land while a page opens and the
 * person begins to read and type. So the library starts only once the page has been quiet for a moment
 * (the browser idle for several full idle periods in a row, none cut short by other work), and the plots
 * waiting for it are then drawn one per frame, each when the browser is idle.
 */

/** Chrome's idle periods last up to 50 ms when nothing else waits; one this long means nothing did. */
const FULL_IDLE_MS = 40;
/** Full idle periods in a row that make the page quiet: about a third of a second with nothing to do. */
const QUIET_PERIODS = 6;
/** A page that never goes quiet (something keeps the browser busy) draws its plots after this anyway. */
const QUIET_AT_MOST_MS = 5000;
/** A plot waits at most this long for an idle moment once the library has started. */
const DRAW_WAIT_MS = 1000;

type Idle = (callback: (deadline: IdleDeadline) => void, options?: IdleRequestOptions) => unknown;

function idleApi(): Idle | null {
  return typeof requestIdleCallback === 'function' ? requestIdleCallback : null;
}

let quiet: Promise<void> | null = null;
/** The page has been quiet once (the promise above has resolved). */
let wasQuiet = false;

/** Resolves once the page has been quiet (see above), or after QUIET_AT_MOST_MS; at once without idle callbacks. */
export function pageQuiet(): Promise<void> {
  const mine = generation;
  quiet ??= new Promise<void>((resolve) => {
    const idle = idleApi();
    if (!idle) return resolve();
    const giveUpAt = performance.now() + QUIET_AT_MOST_MS;
    let inARow = 0;
    const step = (deadline: IdleDeadline) => {
      inARow = deadline.timeRemaining() >= FULL_IDLE_MS ? inARow + 1 : 0;
      const left = giveUpAt - performance.now();
      if (inARow >= QUIET_PERIODS || deadline.didTimeout || left <= 0) resolve();
      // A callback asked for inside an idle period runs in the next one.
      else idle(step, { timeout: Math.ceil(left) });
    };
    idle(step, { timeout: QUIET_AT_MOST_MS });
  }).then(() => {
    if (mine === generation) wasQuiet = true;
  });
  return quiet;
}

/**
 * Plots asked for are waiting for the page to go quiet before the library starts. Other work that can
 * wait (the notebook's bodies far below the window) waits for that moment too: the page cannot go
 * quiet while it goes on, and the plots near the window would wait for all of it.
 */
export function plotsWaitingForQuiet(): boolean {
  return waiting.length > 0 && !wasQuiet;
}

const waiting: (() => Promise<unknown> | void)[] = [];
let draining = false;
/** Which queue a drain belongs to: a reset (tests) starts a new one, and an old drain still under way stops. */
let generation = 0;

/**
 * Calls `draw` when the page is quiet, after the plots asked for before it, one plot per frame. Answers a
 * function that takes the plot out of the queue (its cell went away before it was drawn).
 */
export function scheduleDraw(draw: () => Promise<unknown> | void): () => void {
  let cancelled = false;
  const entry = () => (cancelled ? undefined : draw());
  waiting.push(entry);
  if (!draining) {
    draining = true;
    const mine = generation;
    void pageQuiet().then(() => drainNext(mine));
  }
  return () => {
    cancelled = true;
    const at = waiting.indexOf(entry);
    if (at >= 0) waiting.splice(at, 1);
  };
}

function drainNext(mine: number): void {
  if (mine !== generation) return;
  const next = waiting.shift();
  if (!next) {
    draining = false;
    return;
  }
  const idle = idleApi();
  // The next plot once this one is drawn and its frame is out: one long task per frame at most.
  const again = () => drainNext(mine);
  const after = () => (typeof requestAnimationFrame === 'function' ? requestAnimationFrame(() => setTimeout(again)) : setTimeout(again));
  const run = () => {
    try {
      void Promise.resolve(next()).catch(() => undefined).then(after);
    } catch {
      after();
    }
  };
  if (idle) idle(run, { timeout: DRAW_WAIT_MS });
  else run();
}

/** For tests: forget that the page was once quiet. */
export function resetPlotScheduleForTests(): void {
  generation++;
  quiet = null;
  wasQuiet = false;
  waiting.length = 0;
  draining = false;
}
