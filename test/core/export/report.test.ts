/**
 * The report page: typed text cannot inject markup (checked by Python's html.parser, an HTML tokenizer
 * outside the project: no script element, no event-handler attribute, the hostile text comes back as
 * text), the page has no script and no external resource, and its figures are those of `assess` on the
 * counted entries.
 */
import { describe, expect, it } from 'vitest';
import { assess } from '../../../src/assess/index.ts';
import { makeBundle } from '../../../src/bundle/bundle.ts';
import { pointsOf } from '../../../src/bundle/events.ts';
import { coverageStatement } from '../../../src/export/coverage.ts';
import { assessFlags, escapeHtml, reportHtml, runningInterval } from '../../../src/export/report.ts';
import { pythonOracle } from '../../fixtures/python-oracle.ts';
import { entries, study, uuid, voidOf } from '../bundle/make.ts';

// Python's html.parser, run once and committed (test/fixtures/python-report.json)
const python = pythonOracle('report');

const HOSTILE = {
  name: '<script>alert("name")</script>',
  notes: '"><img src=x onerror=alert(1)>',
  device: "phone-A' onmouseover='alert(2)",
  label: '</td><iframe src="javascript:alert(3)">',
  reason: '<svg onload=alert(4)>',
  unit: 'mg/kg<style>body{display:none}</style>',
};

async function hostileBundle() {
  const st = study(
    {
      kind: 'measurement',
      unit: HOSTILE.unit,
      plotArea: undefined,
      plotAreaUnit: undefined,
      taxon: undefined,
      target: { kind: 'relative', value: 0.25 },
    },
    { name: HOSTILE.name, notes: HOSTILE.notes },
  );
  const values = [12.1, 9.8, 15.2, 11.0, 13.4, 10.9, 12.7, 14.1, 9.5, 12.2, 11.8, 13.0];
  const ev = entries(st, values, HOSTILE.device, 2, 0, () => ({ label: HOSTILE.label }));
  ev.push(...entries(st, [10.4, 12.9], 'phone-B', 4, 30, () => ({ label: HOSTILE.label })));
  for (const [i, e] of ev.entries()) e.seq = i + 1;
  ev.push(voidOf(st, ev[3]!, ev.length + 1, uuid(3, 1), HOSTILE.reason));
  return await makeBundle(st, ev);
}

/** Python html.parser: start tags with their attributes, and all text. */
function pyParse(html: string): { tags: [string, [string, string | null][]][]; text: string } {
  const out = python(
    `import sys, json
from html.parser import HTMLParser
class P(HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=True); self.tags=[]; self.text=[]
    def handle_starttag(self, tag, attrs): self.tags.append([tag, attrs])
    def handle_startendtag(self, tag, attrs): self.tags.append([tag, attrs])
    def handle_data(self, data): self.text.append(data)
p=P(); p.feed(sys.stdin.buffer.read().decode('utf-8')); p.close()
print(json.dumps({'tags': p.tags, 'text': ''.join(p.text)}))`,
    html,
  );
  return JSON.parse(out);
}

// Built at the top level: a bundle and its report are asynchronous (the platform's SHA-256).
const b = await hostileBundle();
const html = await reportHtml(b, { coverage: null });
const parsed = pyParse(html);

describe('report HTML', () => {
  it('typed text cannot inject elements or attributes', async () => {
    const names = new Set(parsed.tags.map(([t]) => t));
    for (const bad of ['script', 'img', 'iframe', 'object', 'embed', 'link', 'base', 'form'])
      expect(names.has(bad), bad).toBe(false);
    // the only style element is the page's own
    expect(parsed.tags.filter(([t]) => t === 'style')).toHaveLength(1);
    for (const [, attrs] of parsed.tags)
      for (const [k, v] of attrs) {
        expect(k.startsWith('on'), `attribute ${k}`).toBe(false);
        expect(String(v ?? '')).not.toMatch(/javascript:/i);
      }
  });
  it('the hostile text is shown as text', async () => {
    for (const v of Object.values(HOSTILE)) expect(parsed.text).toContain(v);
  });
  it('the injection test itself can fail: unescaped text would be caught', async () => {
    const bad = pyParse(`<p>${HOSTILE.notes}</p>`);
    expect(bad.tags.some(([t]) => t === 'img')).toBe(true);
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;');
  });
  it('no script, no external resources; print CSS present', async () => {
    expect(html).not.toMatch(/<script/i);
    for (const [, attrs] of parsed.tags)
      for (const [k] of attrs) expect(['src', 'href', 'srcset'].includes(k), k).toBe(false);
    expect(html).toContain('@media print');
    expect(html).toMatch(/<svg[^>]*role="img"/);
  });
  it('figures are those of assess on the counted entries; coverage not yet measured', async () => {
    const a = assess(pointsOf(b.events), b.study.setup);
    expect(a.n).toBe(13);
    expect(html).toContain(`<code>estimate = ${a.estimate}</code>`);
    expect(html).toContain(`<code>lower = ${a.lower}</code>`);
    expect(html).toContain(`<code>upper = ${a.upper}</code>`);
    expect(parsed.text).toContain(a.verdict.status);
    expect(parsed.text).toContain('Measured coverage of this rule: not yet measured.');
    expect(parsed.text).toContain('14 entries, of which 13 counted and 1 voided (1 void record)');
    expect(parsed.text).toContain(b.checksum.value);
    expect(parsed.text).toContain('The tool gives statistical guidance only.');
  });
  it("the rule's known limits are in the file, in the words the screens show (naive rule: the comparison-only warning)", async () => {
    const naive = await makeBundle({ ...b.study, setup: { ...b.study.setup, rule: 'naive' } }, b.events);
    const text = await reportHtml(naive, { coverage: null });
    expect(text).toContain('<h2>Known limits of this rule</h2>');
    expect(text).toContain('Use it only for comparison.');
    // the default study's own limits (counts under the standard rule) are listed too, without the naive one
    expect(html).not.toContain('Use it only for comparison.');
  });
  it('coverage figure when given', async () => {
    const withCov = await reportHtml(b, { coverage: '0.951 at 95 % (benchmark grid)' });
    expect(pyParse(withCov).text).toContain(
      'Measured coverage of this rule: 0.951 at 95 % (benchmark grid).',
    );
  });
  it('measured coverage: the rule and kind’s benchmark figures, the level they were measured at, and the design caveat', async () => {
    const st = study({ level: 0.9 });
    const counts = await makeBundle(st, entries(st, [3, 0, 5, 2, 7, 0, 1, 4, 2, 3, 6, 1], 'phone-A', 2));
    const text = pyParse(await reportHtml(counts, { coverage: coverageStatement(st.setup) })).text;
    // the count cells of the run of 2026-12-02 as printed in test/bench/coverage.md (standard: 91.5–98.0 %, 36 cells)
    expect(text).toContain('in 91.5–98.0 % of runs across the 36 count cells');
    expect(text).toContain('(The benchmark ran at 95 %; this study uses 90 %.)');
    expect(text).not.toContain('design-based interval');
    const sprt = { ...st.setup, rule: 'sprt' as const };
    expect(coverageStatement(sprt)).toContain('at most 1.68 % of runs (asked: 5 %)');
    const clustered = await makeBundle(
      st,
      entries(st, [3, 0, 5, 2, 7, 0, 1, 4, 2, 3, 6, 1], 'phone-A', 2, 0, (i) => ({ cluster: `T${i % 4}` })),
    );
    expect(pyParse(await reportHtml(clustered, { coverage: coverageStatement(st.setup) })).text).toContain(
      'That benchmark simulates simple random samples; the coverage of this design-based interval under the stopping rule has not been measured.',
    );
  });
  it('running interval ends at the final assessment', async () => {
    const run = runningInterval(b);
    const a = assess(pointsOf(b.events), b.study.setup);
    const last = run[run.length - 1]!;
    expect(last.n).toBe(a.n);
    expect(last.lower).toBe(a.lower);
    expect(last.upper).toBe(a.upper);
  });
  it('reproduce flags', async () => {
    expect(assessFlags(b.study.setup)).toBe(
      '--kind measurement --level 0.95 --sided two --target relative:0.25 --rule standard --min 10',
    );
  });
});
