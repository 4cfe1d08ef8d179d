import "server-only";
import { chromium, type Browser } from "playwright-core";
import { RetryLaterError } from "@/lib/retry-later";

// Headless Chromium prints the same print view a user prints from the browser: one rendering path for
// screen, print and PDF, and no new dependency (playwright-core and Debian's chromium are already used by
// the browser tests). Each render costs a browser process (about 2.6 s of a core), so renders are bounded:
// PLATEAU_PDF_CONCURRENCY at once (1 or 2, default 1), at most PLATEAU_PDF_QUEUE waiting (default 2), at most
// PDF_PER_USER_IN_FLIGHT per user at a time and PDF_PER_USER_PER_WINDOW per user per window; anything beyond
// answers 429 with Retry-After. A render whose client has gone (the request's signal) leaves the queue, or has
// its browser closed, at once, so it frees its slot (issue 12 finding 11).

const ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-dev-shm-usage",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--no-first-run",
];

function intSetting(name: string, fallback: number, min: number, max: number): number {
  const v = Number(process.env[name]);
  return Number.isInteger(v) && v >= min && v <= max ? v : fallback;
}

export const PDF_PER_USER_IN_FLIGHT = 2;
export const PDF_PER_USER_PER_WINDOW = 20;
const WINDOW_MS = 10 * 60_000;

interface Waiter {
  start: () => void;
  fail: (e: unknown) => void;
}

/** The process's render gate: running count, FIFO of waiters, per-user counts and recent starts, mean render time. */
interface Gate {
  running: number;
  waiting: Waiter[];
  perUser: Map<string, number>;
  recent: Map<string, number[]>;
  meanMs: number;
}
const g = globalThis as unknown as { __plateauPdf?: Gate };
const state: Gate = (g.__plateauPdf ??= { running: 0, waiting: [], perUser: new Map<string, number>(), recent: new Map<string, number[]>(), meanMs: 3000 });

export function pdfLimits() {
  return { concurrency: intSetting("PLATEAU_PDF_CONCURRENCY", 1, 1, 2), queue: intSetting("PLATEAU_PDF_QUEUE", 2, 0, 20) };
}

const abortError = () => new DOMException("The client went away; the PDF was not rendered.", "AbortError");

function busy(code: string, message: string, seconds: number): RetryLaterError {
  return new RetryLaterError(429, code, message, Math.max(1, Math.ceil(seconds)));
}

/**
 * Render `url` (the report's print view) to an A4 PDF with a page footer, for `userId`, within the bounds above.
 * Throws RetryLaterError (429) when the queue is full or the user is over a limit, and an AbortError as soon as
 * `signal` aborts (waiting: it leaves the queue; rendering: its browser is closed).
 */
export async function renderPdf(url: string, footerTitle: string, opts: { userId: string; signal?: AbortSignal }): Promise<Buffer> {
  const { concurrency, queue } = pdfLimits();
  const { userId, signal } = opts;
  if (signal?.aborted) throw abortError();
  const now = Date.now();
  // forget people whose last PDF is older than the window, so the map stays as small as the recent users
  if (state.recent.size > 1000) for (const [u, times] of state.recent) if (now - (times.at(-1) ?? 0) >= WINDOW_MS) state.recent.delete(u);
  const recent = (state.recent.get(userId) ?? []).filter((t) => now - t < WINDOW_MS);
  state.recent.set(userId, recent);
  if (recent.length >= PDF_PER_USER_PER_WINDOW)
    throw busy("rate_limited", `At most ${PDF_PER_USER_PER_WINDOW} PDFs per person in 10 minutes; try again later.`, (recent[0]! + WINDOW_MS - now) / 1000);
  const mine = state.perUser.get(userId) ?? 0;
  if (mine >= PDF_PER_USER_IN_FLIGHT) throw busy("rate_limited", `You already have ${mine} PDFs being made; wait for them first.`, state.meanMs / 1000);
  if (state.running >= concurrency && state.waiting.length >= queue)
    throw busy("busy", "Too many PDFs are being made right now; try again shortly.", ((state.waiting.length + 1) * state.meanMs) / concurrency / 1000);

  recent.push(now);
  state.perUser.set(userId, mine + 1);
  try {
    await acquire(concurrency, signal);
    try {
      const t0 = Date.now();
      const pdf = await render(url, footerTitle, signal);
      state.meanMs = 0.7 * state.meanMs + 0.3 * (Date.now() - t0);
      return pdf;
    } finally {
      release();
    }
  } finally {
    const n = (state.perUser.get(userId) ?? 1) - 1;
    if (n > 0) state.perUser.set(userId, n);
    else state.perUser.delete(userId);
  }
}

function acquire(concurrency: number, signal?: AbortSignal): Promise<void> {
  if (state.running < concurrency) {
    state.running += 1;
    return Promise.resolve();
  }
  return new Promise<void>((resolve, reject) => {
    const w: Waiter = {
      start: () => {
        signal?.removeEventListener("abort", onAbort);
        state.running += 1;
        resolve();
      },
      fail: reject,
    };
    const onAbort = () => {
      const i = state.waiting.indexOf(w);
      if (i >= 0) state.waiting.splice(i, 1);
      reject(abortError());
    };
    signal?.addEventListener("abort", onAbort, { once: true });
    state.waiting.push(w);
  });
}

function release(): void {
  state.running -= 1;
  const next = state.waiting.shift();
  if (next) next.start();
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

async function render(url: string, footerTitle: string, signal?: AbortSignal): Promise<Buffer> {
  if (signal?.aborted) throw abortError();
  let browser: Browser | undefined;
  let aborted = false;
  // the client left: close the browser now, which makes the pending goto/pdf reject
  const onAbort = () => {
    aborted = true;
    void browser?.close().catch(() => undefined);
  };
  signal?.addEventListener("abort", onAbort, { once: true });
  try {
    browser = await chromium.launch({
      executablePath: process.env.PLATEAU_CHROMIUM ?? "/usr/bin/chromium",
      args: ARGS,
      timeout: 30_000,
    });
    if (aborted) throw abortError();
    const context = await browser.newContext({ viewport: { width: 1100, height: 1400 }, javaScriptEnabled: true });
    const page = await context.newPage();
    const res = await page.goto(url, { waitUntil: "networkidle", timeout: 30_000 });
    if (!res || res.status() !== 200) throw new Error(`print view answered ${res?.status() ?? "nothing"}`);
    await page.waitForSelector("[data-report-body]", { timeout: 15_000 });
    // Charts draw after hydration; wait until none is pending, and for the web fonts.
    await page.waitForFunction(() => document.querySelectorAll("[data-chart-pending]").length === 0, undefined, { timeout: 15_000 });
    await page.evaluate(() => document.fonts.ready.then(() => undefined));
    await page.emulateMedia({ media: "print" });
    const footer = `<div style="font-size:7.5px;color:#5f6368;width:100%;padding:0 14mm;display:flex;justify-content:space-between;font-family:sans-serif">
      <span>${escapeHtml(footerTitle)}</span><span>Page <span class="pageNumber"></span> of <span class="totalPages"></span></span></div>`;
    const pdf = await page.pdf({
      format: "A4",
      printBackground: true,
      margin: { top: "14mm", bottom: "16mm", left: "14mm", right: "14mm" },
      displayHeaderFooter: true,
      headerTemplate: "<span></span>",
      footerTemplate: footer,
    });
    if (aborted) throw abortError();
    return Buffer.from(pdf);
  } catch (e) {
    if (aborted) throw abortError();
    throw e;
  } finally {
    signal?.removeEventListener("abort", onAbort);
    await browser?.close().catch(() => undefined);
  }
}
