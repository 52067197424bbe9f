// Waiting on a page without hanging. Playwright bounds its own waits (`waitForFunction`,
// `waitForSelector`, actions), but not `evaluate`, `newContext` or `close`, nor a promise made in
// the page; the helpers here bound those, and say what they were waiting for when they give up.

// Waits until `predicate`, run in the page or frame `target` with `arg`, returns something truthy
// (it may be async), and returns that. Playwright's own `waitForFunction` does not wait for the
// promise an async predicate returns, and so would take any async predicate as met at once.
export async function waitInPage(target, predicate, arg, { timeout = 30_000, interval = 200, what = "the condition" } = {}) {
  const deadline = Date.now() + timeout;
  let last;
  for (;;) {
    last = await target.evaluate(predicate, arg);
    if (last) {
      return last;
    }
    if (Date.now() > deadline) {
      throw new Error(`${what} was not met within ${timeout} ms`);
    }
    await new Promise((done) => setTimeout(done, interval));
  }
}

// Resolves to what `promise` resolves to, or throws, naming `what`, once `ms` have passed without
// an answer. Playwright bounds its waits but not `evaluate`, `newContext` or `close`; a browser
// that stops answering would otherwise hold a test until the runner's limit, with no word of
// the step it was on.
export function within(ms, what, promise) {
  let timer;
  const late = new Promise((_, fail) => {
    timer = setTimeout(() => fail(new Error(`${what}: no answer within ${ms} ms`)), ms);
  });
  return Promise.race([promise, late]).finally(() => clearTimeout(timer));
}

// Waits until the browser has drawn two more frames of `page`: by then a change's layout is on
// screen and any layout shift it caused is reported. Headless Chromium now and then draws no
// frame of a page for a while, though the page's thread is free (it answers a timer). Such a
// stall is told from a frozen page: the first is met by bringing the page to the front once and
// waiting again, and reported through `note`; a page whose thread does not answer, or that draws
// nothing even then, fails with what was seen.
export async function drawn(page, { timeout = 5_000, note = () => {} } = {}) {
  const wait = () =>
    within(
      timeout + 5_000,
      "the page's thread, asked for two frames",
      page.evaluate(
        (timeout) =>
          new Promise((done) => {
            setTimeout(() => done(document.visibilityState), timeout);
            requestAnimationFrame(() => requestAnimationFrame(() => done(true)));
          }),
        timeout,
      ),
    );
  const first = await wait();
  if (first === true) {
    return;
  }
  note(`no frame drawn within ${timeout} ms (the page ${first}, its thread free); brought to the front`);
  await within(10_000, "bringing the page to the front", page.bringToFront());
  const again = await wait();
  if (again !== true) {
    throw new Error(`no frame drawn within ${timeout} ms, twice, though the page's thread was free (the page ${again})`);
  }
}
