import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { plotsWaitingForQuiet, resetPlotScheduleForTests, scheduleDraw } from './plot-schedule';

/** The browser's idle callbacks, run by the test with the idle time it chooses. */
class IdleBrowser {
  private queue: ((deadline: IdleDeadline) => void)[] = [];
  readonly install = () => {
    (window as { requestIdleCallback?: unknown }).requestIdleCallback = (cb: (d: IdleDeadline) => void) => this.queue.push(cb);
  };
  /** One idle period of `ms` milliseconds: runs the callbacks asked for before it. */
  period(ms: number, didTimeout = false): void {
    const due = this.queue;
    this.queue = [];
    for (const cb of due) cb({ didTimeout, timeRemaining: () => ms });
  }
}

const settle = () => new Promise((r) => setTimeout(r, 5));

describe('when plots are drawn', () => {
  let browser: IdleBrowser;
  const saved = { idle: (window as { requestIdleCallback?: unknown }).requestIdleCallback };
  beforeEach(() => {
    resetPlotScheduleForTests();
    browser = new IdleBrowser();
    browser.install();
  });
  afterEach(() => {
    (window as { requestIdleCallback?: unknown }).requestIdleCallback = saved.idle;
    resetPlotScheduleForTests();
  });

  it('says while plots wait for the page to go quiet, so other work that can wait holds back until then', async () => {
    expect(plotsWaitingForQuiet()).toBe(false);
    scheduleDraw(() => undefined);
    for (let i = 0; i < 5; i++) browser.period(50);
    await settle();
    expect(plotsWaitingForQuiet()).toBe(true);
    browser.period(50);
    await settle();
    expect(plotsWaitingForQuiet()).toBe(false);
  });

  it('waits while the page is busy, and starts once it has been quiet for several full idle periods in a row', async () => {
    const drawn: string[] = [];
    scheduleDraw(() => void drawn.push('Cp'));
    // Short idle periods between other work: the page is still busy (a body drawn, a keystroke answered).
    for (let i = 0; i < 20; i++) browser.period(4);
    await settle();
    expect(drawn).toEqual([]);
    // Five full periods and then a short one: the run starts again.
    for (let i = 0; i < 5; i++) browser.period(49);
    browser.period(3);
    await settle();
    expect(drawn).toEqual([]);
    for (let i = 0; i < 6; i++) browser.period(49);
    await settle();
    // Quiet now; the plot itself waits for the next idle moment.
    browser.period(49);
    await settle();
    expect(drawn).toEqual(['Cp']);
  });

  it('draws the waiting plots one at a time, each after the one before has been drawn, and skips one taken away', async () => {
    const drawn: string[] = [];
    let finishFirst: () => void = () => undefined;
    scheduleDraw(() => {
      drawn.push('N');
      return new Promise<void>((resolve) => (finishFirst = resolve));
    });
    const cancelH = scheduleDraw(() => void drawn.push('H'));
    scheduleDraw(() => void drawn.push('c_f'));
    for (let i = 0; i < 6; i++) browser.period(49);
    await settle();
    browser.period(49);
    await settle();
    expect(drawn).toEqual(['N']);
    // While the first is still drawing, idle time draws nothing more.
    browser.period(49);
    await settle();
    expect(drawn).toEqual(['N']);
    cancelH();
    finishFirst();
    await settle();
    await new Promise((r) => (typeof requestAnimationFrame === 'function' ? requestAnimationFrame(() => setTimeout(r, 5)) : setTimeout(r, 20)));
    browser.period(49);
    await settle();
    expect(drawn).toEqual(['N', 'c_f']);
  });

  it('draws anyway when the page never goes quiet (the idle callback timed out)', async () => {
    const drawn: string[] = [];
    scheduleDraw(() => void drawn.push('Re_theta'));
    browser.period(2, true);
    await settle();
    browser.period(2, true);
    await settle();
    expect(drawn).toEqual(['Re_theta']);
  });
});
