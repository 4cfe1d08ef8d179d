import "server-only";
import { chromium } from "playwright-core";

// Headless Chromium prints the same print view a user prints from the browser: one rendering path for
// screen, print and PDF, and no new dependency (playwright-core and Debian's chromium are already used by
// the browser tests). One PDF at a time: each render costs a browser process on a small shared machine.
let queue: Promise<unknown> = Promise.resolve();

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

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** Render `url` (the report's print view) to an A4 PDF with a page footer. */
export function renderPdf(url: string, footerTitle: string): Promise<Buffer> {
  const run = queue.then(() => render(url, footerTitle));
  queue = run.catch(() => undefined);
  return run;
}

async function render(url: string, footerTitle: string): Promise<Buffer> {
  const browser = await chromium.launch({
    executablePath: process.env.PLATEAU_CHROMIUM ?? "/usr/bin/chromium",
    args: ARGS,
    timeout: 30_000,
  });
  try {
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
    return Buffer.from(pdf);
  } finally {
    await browser.close().catch(() => undefined);
  }
}
