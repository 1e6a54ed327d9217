/**
 * Security on the production build: the Content Security Policy (W3C CSP Level 3) has no inline script
 * and no eval, the browser enforces it (a planted inline script and eval are refused — the negative
 * control that shows the listeners below can see a violation), the app works under it (a full journey
 * raises no `securitypolicyviolation` event and no CSP console error, the printable-report window
 * included), and no request of that journey — page, popup or service worker — leaves the app's origin
 * (data: and blob: URLs stay on the phone).
 */
import { type BrowserContext, expect, type Page, test } from '@playwright/test';
import { openFresh } from './fixtures/browser.ts';
import { createMeasurementStudy, keyIn } from './helpers.ts';

/** The directives of the policy in the served index.html. */
function cspOf(html: string): Map<string, string[]> {
  const m = /<meta\s+http-equiv="Content-Security-Policy"\s+content="([^"]+)"/i.exec(html);
  expect(m, 'index.html has a CSP meta element').not.toBeNull();
  const out = new Map<string, string[]>();
  for (const part of m![1]!.split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) out.set(name.toLowerCase(), values);
  }
  return out;
}

interface Watch {
  violations: string[];
  consoleCsp: string[];
  requests: string[];
  pageErrors: string[];
}

/** Records CSP violations (every page and popup), CSP console errors, page errors and every request. */
async function watch(context: BrowserContext): Promise<Watch> {
  const w: Watch = { violations: [], consoleCsp: [], requests: [], pageErrors: [] };
  await context.exposeBinding('__cspViolation', (_src, text: string) => {
    w.violations.push(text);
  });
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      const report = (window as unknown as { __cspViolation?: (t: string) => void }).__cspViolation;
      report?.(
        `${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} at ${e.sourceFile}:${e.lineNumber}`,
      );
    });
  });
  const onPage = (p: Page) => {
    p.on('console', (m) => {
      if (
        /Content[- ]Security[- ]Policy|Refused to (execute|load|apply|evaluate|connect|frame)/i.test(m.text())
      )
        w.consoleCsp.push(m.text());
    });
    p.on('pageerror', (e) => w.pageErrors.push(String(e)));
  };
  context.pages().forEach(onPage);
  context.on('page', onPage);
  // Context-level requests include those of popups and of the service worker (Chromium).
  context.on('request', (r) => {
    w.requests.push(r.url());
  });
  return w;
}

function foreign(urls: string[], origin: string): string[] {
  return urls.filter((u) => {
    const scheme = u.slice(0, u.indexOf(':'));
    if (scheme === 'data' || scheme === 'blob') return false;
    try {
      return new URL(u).origin !== origin;
    } catch {
      return true;
    }
  });
}

test('the served page carries a strict policy, and the browser enforces it', async ({
  page,
  request,
  baseURL,
}) => {
  const html = await (await request.get('/')).text();
  const csp = cspOf(html);
  expect(csp.get('default-src')).toEqual(["'self'"]);
  for (const d of ['script-src', 'default-src', 'connect-src', 'style-src']) {
    const v = csp.get(d) ?? csp.get('default-src')!;
    expect(v, d).not.toContain("'unsafe-inline'");
    expect(v, d).not.toContain("'unsafe-eval'");
    expect(v, d).not.toContain('*');
    expect(
      v.some((s) => /^(https?:|data:|blob:)/.test(s)),
      `${d} allows only the origin`,
    ).toBe(false);
  }
  expect(csp.get('script-src')).toEqual(["'self'"]);
  expect(csp.get('object-src')).toEqual(["'none'"]);
  // every script of the page is an external, same-origin file; no inline handlers
  const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
  expect(scripts.length).toBeGreaterThan(0);
  for (const [, attrs, body] of scripts) {
    expect(body!.trim(), 'inline script body').toBe('');
    const src = /\bsrc="([^"]+)"/.exec(attrs!)?.[1];
    expect(src, 'script has a src').toBeTruthy();
    expect(new URL(src!, baseURL).origin).toBe(new URL(baseURL!).origin);
  }
  expect(html).not.toMatch(/\son[a-z]+\s*=/i);
  // the shipped JavaScript never evaluates strings
  const files = [...scripts.map(([, a]) => /\bsrc="([^"]+)"/.exec(a!)![1]!), '/sw.js'];
  for (const f of files) {
    const js = await (await request.get(f)).text();
    expect(js, f).not.toMatch(/\beval\s*\(|new\s+Function\s*\(/);
  }

  // enforcement (negative control for the listeners of the journey test)
  const w = await watch(page.context());
  await page.goto('/');
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  // Code run by page.evaluate itself is exempt from the policy (DevTools), so the probe runs from a
  // timer callback: the page's own realm, as an attacker's string would.
  await page.evaluate(() => {
    setTimeout(() => {
      const out: Record<string, string> = {};
      try {
        // biome-ignore lint/security/noGlobalEval: the probe checks that the policy refuses eval
        eval('1 + 1');
        out.eval = 'ran';
      } catch (e) {
        out.eval = (e as Error).name;
      }
      try {
        new Function('return 1')();
        out.fn = 'ran';
      } catch (e) {
        out.fn = (e as Error).name;
      }
      const s = document.createElement('script');
      s.textContent = 'window.__inlineRan = 1';
      document.body.append(s);
      out.inline = String((window as unknown as { __inlineRan?: number }).__inlineRan ?? 'blocked');
      (window as unknown as { __probe?: object }).__probe = out;
    }, 0);
  });
  const probe = await page
    .waitForFunction(() => (window as unknown as { __probe?: object }).__probe)
    .then((h) => h.jsonValue());
  expect(probe).toEqual({ eval: 'EvalError', fn: 'EvalError', inline: 'blocked' });
  await expect.poll(() => w.violations.length).toBeGreaterThanOrEqual(3);
  expect(w.violations.some((v) => v.startsWith('script-src'))).toBe(true);
});

test.describe('journey', () => {
  // an emulated position (no network is involved) so that the map export has something to carry
  test.use({
    permissions: ['geolocation'],
    geolocation: { latitude: 47.3769, longitude: 8.5417, accuracy: 9 },
  });

  test('a full journey raises no policy violation and sends nothing off the origin', async ({
    page,
    baseURL,
  }) => {
    test.setTimeout(120_000);
    const origin = new URL(baseURL!).origin;
    const context = page.context();
    const w = await watch(context);
    await openFresh(page);

    // a study, entries with a note, every screen
    await createMeasurementStudy(page, { name: 'Outfall 3, dissolved zinc', unit: 'µg/L', margin: '2' });
    const studyUrl = page.url();
    await page.getByRole('button', { name: /^(GPS|position) off$/ }).click();
    await expect(page.getByRole('button', { name: /GPS ± 9 m/ })).toBeVisible();
    for (const v of ['12,1', '14,8', '13,3']) await keyIn(page, v);
    await page.getByRole('button', { name: /^Note/ }).click();
    await page.getByLabel('Note for the next entry').fill('turbid after rain');
    await keyIn(page, '15');
    const tabs = page.getByRole('navigation', { name: 'Study screens' });
    await tabs.getByRole('link', { name: 'Log' }).click();
    await expect(page.getByTestId('log-entry')).toHaveCount(4);
    await tabs.getByRole('link', { name: 'Report' }).click();
    await expect(page.getByTestId('report-verdict')).toBeVisible();

    // every export, then the printable report in its own window
    // (Darwin Core tables are for count studies; this one is a measurement study)
    const formats = ['bundle', 'csv', 'geojson', 'report'];
    const downloads: string[] = [];
    page.on('download', (d) => downloads.push(d.suggestedFilename()));
    const status = page.getByTestId('handover-status');
    for (const f of formats) {
      await expect(page.getByTestId(`export-${f}`)).toBeEnabled();
      const n = downloads.length;
      await page.getByTestId(`export-${f}`).click();
      await expect.poll(() => downloads.length, `export ${f} downloads`).toBeGreaterThan(n);
      await expect(status).toContainText('Downloaded');
    }
    const popupP = context.waitForEvent('page');
    await page.getByTestId('open-report').click();
    const popup = await popupP;
    await popup.waitForLoadState();
    await expect(popup.locator('body')).toContainText('Outfall 3, dissolved zinc');
    // the report's own style sheet applies in that window (src/export/report.ts: .verdict has a 2px border)
    await expect(popup.locator('.verdict')).toHaveCSS('border-top-width', '2px');

    // the other screens: studies, new study, demo, archived list, an unknown link
    for (const hash of ['#/', '#/new', '#/demo', '#/?archived=1', '#/no/such/screen']) {
      await page.goto(`/${hash}`);
      await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    }
    // offline: reload the study from the service worker
    await context.setOffline(true);
    await page.goto(studyUrl);
    await expect(page.getByTestId('n')).toHaveText('4');
    await context.setOffline(false);

    expect(w.requests.length).toBeGreaterThan(5);
    // the service worker's own fetches are in the record too: only its precaching asks for /index.html
    // (the pages ask for / and the SW answers navigations from its cache)
    expect(w.requests).toContain(`${origin}/index.html`);
    expect(foreign(w.requests, origin), 'requests that left the origin').toEqual([]);
    expect(w.violations, 'securitypolicyviolation events').toEqual([]);
    expect(w.consoleCsp, 'CSP console errors').toEqual([]);
    expect(w.pageErrors, 'uncaught page errors').toEqual([]);
  });
});
