/**
 * Exports checked by things outside the project:
 * - CSV read back by Python's csv module (RFC 4180 dialect: comma, double quote, CRLF) and compared
 *   field by field with the event log; the data dictionary describes every column.
 * - GeoJSON checked rule by rule against RFC 7946 (sections cited beside each check).
 * - Darwin Core term names checked against the TDWG term list read from the tdwg/dwc repository
 *   (test/fixtures/handover-dwc-terms.json names the file and commit).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { makeBundle } from '../../../src/bundle/bundle.ts';
import { dataDictionaryCsv, eventsCsv, valueColumnName } from '../../../src/export/csv.ts';
import { DWC_EVENT_TERMS, DWC_OCCURRENCE_TERMS, dwcTables } from '../../../src/export/dwc.ts';
import { entriesGeoJson, geoJsonText } from '../../../src/export/geojson.ts';
import { csvField } from '../../../src/export/rfc4180.ts';
import { unitSlug } from '../../../src/export/units.ts';
import { pythonOracle } from '../../fixtures/python-oracle.ts';
import { entries, study, uuid, voidOf } from '../bundle/make.ts';

// Python's csv module, run once and committed (test/fixtures/python-formats.json)
const python = pythonOracle('formats');

const awkward = [
  'plain',
  'comma, inside',
  'quote " inside',
  'line\r\nbreak',
  'ünïcødé 🌿 日本',
  '=SUM(A1)',
  ' lead space',
];

async function countBundle() {
  const st = study({}, { notes: 'Field notes, "first" day' });
  const ev = entries(st, [3, 0, 5, 2, 7, 0, 1], 'phone-A', 2, 0, (i) => ({
    label: `Q${i + 1}`,
    note: awkward[i],
    ...(i !== 3
      ? { position: { lat: 52.0907 + i / 10000, lon: 5.1214 - i / 10000, accuracyM: i === 5 ? 0 : 4 + i } }
      : {}),
    ...(i === 6 ? { stratum: 'wet', cluster: 'T2' } : {}),
  }));
  ev.push(voidOf(st, ev[2]!, 8, uuid(3, 1), 'plot counted twice, "Q3"'));
  return await makeBundle(st, ev);
}

async function measurementBundle() {
  const st = study({
    kind: 'measurement',
    unit: 'mg/kg',
    outcomeName: 'lead in topsoil',
    plotArea: undefined,
    taxon: undefined,
  });
  const ev = entries(st, [12.5, 0.5, 301, 44.25], 'phone-B', 4, 0, (i) =>
    i === 1 ? { censored: true } : {},
  );
  return await makeBundle(st, ev);
}

/** Python's csv module reads the text (newline='' as its docs require) and returns rows as JSON. */
// Built once at the top level: a bundle is asynchronous (its checksum is the platform's SHA-256).
const COUNT = await countBundle();

function pythonCsv(text: string): string[][] {
  const out = python(
    'import sys,csv,io,json\nraw=sys.stdin.buffer.read().decode("utf-8")\nprint(json.dumps(list(csv.reader(io.StringIO(raw, newline=""), strict=True))))',
    text,
  );
  return JSON.parse(out);
}

describe('CSV (RFC 4180) read back by Python csv', () => {
  const b = COUNT;
  const text = eventsCsv(b);
  const rows = pythonCsv(text);
  const [header, ...body] = rows;

  it('every record ends with CRLF (RFC 4180 §2 rules 1–2), no bare LF outside quotes', async () => {
    expect(text.endsWith('\r\n')).toBe(true);
    // Remove quoted fields; what is left must only have CRLF line ends.
    const unquoted = text.replace(/"(?:[^"]|"")*"/g, '');
    expect(unquoted.split('\r\n').every((line) => !line.includes('\n') && !line.includes('\r'))).toBe(true);
  });
  it('one row per event including voids, with status', async () => {
    expect(body).toHaveLength(b.events.length);
    const st = body.map((r) => r[header!.indexOf('status')]);
    expect(st).toEqual([
      'counted',
      'counted',
      'voided',
      'counted',
      'counted',
      'counted',
      'counted',
      'void-record',
    ]);
  });
  it('fields come back exactly (commas, quotes, CRLF, non-ASCII)', async () => {
    const note = header!.indexOf('note');
    expect(body.slice(0, 7).map((r) => r[note])).toEqual(awkward);
    expect(body[7]![header!.indexOf('void_reason')]).toBe('plot counted twice, "Q3"');
    expect(body[7]![header!.indexOf('voids')]).toBe(b.events[2]!.id);
    const vcol = header!.indexOf('count_per_plot');
    expect(body.map((r) => r[vcol])).toEqual(['3', '0', '5', '2', '7', '0', '1', '']);
    expect(body[0]![header!.indexOf('at')]).toBe('2026-05-04T09:00:00+02:00');
    expect(Number(body[1]![header!.indexOf('latitude')])).toBe(b.events[1]!.position!.lat);
    expect(Number(body[1]![header!.indexOf('longitude')])).toBe(b.events[1]!.position!.lon);
    expect(body[3]![header!.indexOf('latitude')]).toBe('');
  });
  it('all rows have the header width', async () => {
    for (const r of body) expect(r).toHaveLength(header!.length);
  });
  it('the data dictionary describes every column, in order, then the study-level design', async () => {
    const dict = pythonCsv(dataDictionaryCsv(b));
    expect(dict[0]).toEqual(['column', 'type', 'unit', 'description', 'allowed_values']);
    const columnRows = dict.slice(1).filter((r) => !r[0]!.startsWith('study.'));
    expect(columnRows.map((r) => r[0])).toEqual(header);
    expect(dict.slice(1 + header!.length).every((r) => r[0]!.startsWith('study.'))).toBe(true);
    for (const r of dict.slice(1)) expect(r[3]!.length).toBeGreaterThan(10);
    // one entry carries a primary unit (T2), so the estimate uses primary units (the pipeline's estimator choice, src/assess/subject.ts)
    expect(dict.find((r) => r[0] === 'study.design')![4]).toBe('primary units');
  });
  it('the dictionary states strata weights, costs, units, the design and the non-detect method (RFC 4180 kept)', async () => {
    const st = study({
      kind: 'measurement',
      unit: 'ug/L',
      plotArea: undefined,
      taxon: undefined,
      strata: [
        { name: 'upstream, "old" weir', weight: 3, cost: 2.5, population: 40 },
        { name: 'downstream', weight: 1 },
      ],
      nonDetects: 'half-limit',
      reportingLimit: 0.2,
    });
    const m = await makeBundle(
      st,
      entries(st, [1.2, 0.2, 0.9, 1.4], 'phone-B', 4, 0, (i) => ({
        stratum: i % 2 ? 'downstream' : 'upstream, "old" weir',
        ...(i === 1 ? { censored: true } : {}),
      })),
    );
    const text = dataDictionaryCsv(m);
    // RFC 4180 §2 rules 1–2 (CRLF after every record, the last too) and rule 4 (same field count per record)
    expect(text.endsWith('\r\n')).toBe(true);
    expect(
      text
        .replace(/"(?:[^"]|"")*"/g, '')
        .split('\r\n')
        .slice(0, -1)
        .every((l) => l.split(',').length === 5),
    ).toBe(true);
    const dict = pythonCsv(text);
    for (const r of dict) expect(r).toHaveLength(5);
    const setting = (name: string) => dict.find((r) => r[0] === name);
    expect(setting('study.design')![4]).toBe('stratified');
    expect(setting('study.design')![3]).toMatch(/stratified mean \(Cochran 1977, ch\. 5\)/);
    expect(setting('study.stratum.upstream, "old" weir.weight')!.slice(1)).toEqual([
      'number',
      'relative weight',
      expect.stringContaining('here 75 %'),
      '3',
    ]);
    expect(setting('study.stratum.upstream, "old" weir.cost')![4]).toBe('2.5');
    expect(setting('study.stratum.upstream, "old" weir.population')![4]).toBe('40');
    expect(setting('study.stratum.downstream.weight')![3]).toContain('here 25 %');
    expect(setting('study.stratum.downstream.cost')).toBeUndefined();
    expect(setting('study.non_detects')![4]).toBe('half-limit');
    expect(setting('study.non_detects')![3]).toContain('half the reporting limit');
    expect(setting('study.reporting_limit')!.slice(2)).toEqual(['ug/L', expect.any(String), '0.2']);
    expect(setting('stratum')![4]).toBe('upstream, "old" weir, downstream');
    expect(setting('censored')![3]).toContain('half the reporting limit');
    // no design rows that do not apply: counts have no non-detect row; a composite study says so
    const c = await countBundle();
    expect(pythonCsv(dataDictionaryCsv(c)).some((r) => r[0] === 'study.non_detects')).toBe(false);
    const cs = study({ kind: 'measurement', plotArea: undefined, taxon: undefined, design: 'composite' });
    const comp = pythonCsv(dataDictionaryCsv(await makeBundle(cs, entries(cs, [4, 5], 'x', 2))));
    expect(comp.find((r) => r[0] === 'study.design')![4]).toBe('composite');
    expect(comp.find((r) => r[0] === 'study.non_detects')![4]).toBe('kaplan-meier');
  });
  it('measurement: unit in the value header, censored column', async () => {
    const m = await measurementBundle();
    const [h, ...r] = pythonCsv(eventsCsv(m));
    expect(h).toContain('value_mg_per_kg');
    expect(r.map((x) => x[h!.indexOf('censored')])).toEqual(['false', 'true', 'false', 'false']);
    expect(r.map((x) => Number(x[h!.indexOf('value_mg_per_kg')]))).toEqual([12.5, 0.5, 301, 44.25]);
    const dict = pythonCsv(dataDictionaryCsv(m));
    expect(dict.find((x) => x[0] === 'value_mg_per_kg')![2]).toBe('mg/kg');
  });
  it('field quoting by RFC 4180 §2 rules 6–7', async () => {
    expect(csvField('a')).toBe('a');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('x\ny')).toBe('"x\ny"');
    expect(csvField(undefined)).toBe('');
  });
  it('unit slugs for headers', async () => {
    expect(unitSlug('mg/kg')).toBe('mg_per_kg');
    expect(unitSlug('ug/L')).toBe('ug_per_L');
    expect(unitSlug('µg/m3')).toBe('ug_per_m3');
    expect(unitSlug('%')).toBe('percent');
    expect(
      valueColumnName({ kind: 'measurement', level: 0.95, sided: 'two', rule: 'standard', min: 10 }),
    ).toBe('value');
  });
});

describe('GeoJSON (RFC 7946)', () => {
  const b = COUNT;
  const parsed = JSON.parse(geoJsonText(b));

  it('§3.3: a FeatureCollection with a "features" array', async () => {
    expect(parsed.type).toBe('FeatureCollection');
    expect(Array.isArray(parsed.features)).toBe(true);
  });
  it('§4: no "crs" member anywhere', async () => {
    expect(JSON.stringify(parsed)).not.toContain('"crs"');
  });
  it('§3.2: each Feature has "type", "geometry" and "properties" (an object); id is a string', async () => {
    for (const f of parsed.features) {
      expect(f.type).toBe('Feature');
      expect(f).toHaveProperty('geometry');
      expect(typeof f.properties).toBe('object');
      expect(typeof f.id).toBe('string');
    }
  });
  it('§3.1.2 / §3.1.1: Point with one position [longitude, latitude], numbers only', async () => {
    const positioned = b.events.filter((e) => e.position && e.voids === undefined);
    expect(parsed.features).toHaveLength(positioned.length);
    parsed.features.forEach((f: { geometry: { type: string; coordinates: number[] } }, i: number) => {
      expect(f.geometry.type).toBe('Point');
      expect(f.geometry.coordinates).toHaveLength(2);
      expect(f.geometry.coordinates[0]).toBe(positioned[i]!.position!.lon);
      expect(f.geometry.coordinates[1]).toBe(positioned[i]!.position!.lat);
      expect(Math.abs(f.geometry.coordinates[0]!)).toBeLessThanOrEqual(180);
      expect(Math.abs(f.geometry.coordinates[1]!)).toBeLessThanOrEqual(90);
    });
  });
  it('accuracy is a property; voided entries are marked; entries without position left out', async () => {
    const fc = entriesGeoJson(b);
    expect(fc.features.map((f) => f.properties.accuracy_m)).toEqual([4, 5, 6, 8, 0, 10]);
    expect(fc.features.map((f) => f.properties.status)).toEqual([
      'counted',
      'counted',
      'voided',
      'counted',
      'counted',
      'counted',
    ]);
    expect(fc.features.some((f) => f.properties.label === 'Q4')).toBe(false);
  });
  it('§7: no foreign member reuses a GeoJSON member name inside properties', async () => {
    for (const f of parsed.features)
      for (const k of ['type', 'geometry', 'coordinates', 'features'])
        expect(f.properties).not.toHaveProperty(k);
  });
});

describe('Darwin Core tables', () => {
  const fixture = JSON.parse(
    readFileSync(new URL('../../fixtures/handover-dwc-terms.json', import.meta.url), 'utf8'),
  );
  const tdwg = new Set<string>(fixture.tdwgTerms);
  const b = COUNT;
  const r = dwcTables(b);
  if (!r.ok) throw new Error(r.message);
  const ev = pythonCsv(r.event);
  const occ = pythonCsv(r.occurrence);

  it('the terms used are exactly the fixture list, each spelled as in the TDWG term list', async () => {
    expect([...DWC_EVENT_TERMS]).toEqual(fixture.termsUsed.event);
    expect([...DWC_OCCURRENCE_TERMS]).toEqual(fixture.termsUsed.occurrence);
    for (const t of [...DWC_EVENT_TERMS, ...DWC_OCCURRENCE_TERMS]) expect(tdwg.has(t), t).toBe(true);
    expect(ev[0]).toEqual(fixture.termsUsed.event);
    expect(occ[0]).toEqual(fixture.termsUsed.occurrence);
  });
  it('a misspelling would be caught (the check can fail)', async () => {
    expect(tdwg.has('decimalLatitudes')).toBe(false);
    expect(tdwg.has('coordinateUncertaintyInMetres')).toBe(false);
  });
  it('one parent event, one child event and one occurrence per counted plot; zeros kept as absences', async () => {
    const counted = 6; // 7 entries, one voided
    expect(ev).toHaveLength(1 + 1 + counted);
    expect(occ).toHaveLength(1 + counted);
    const col = (rows: string[][], t: string) => rows.slice(1).map((x) => x[rows[0]!.indexOf(t)]);
    expect(col(occ, 'individualCount')).toEqual(['3', '0', '2', '7', '0', '1']);
    expect(col(occ, 'occurrenceStatus')).toEqual([
      'present',
      'absent',
      'present',
      'present',
      'absent',
      'present',
    ]);
    expect(new Set(col(occ, 'basisOfRecord'))).toEqual(new Set(['HumanObservation']));
    expect(new Set(col(occ, 'scientificName'))).toEqual(new Set(['Carex nigra']));
    expect(col(occ, 'eventID')).toEqual(col(ev, 'eventID').slice(1));
  });
  it('effort, place and time on the events', async () => {
    const col = (t: string) => ev.slice(1).map((x) => x[ev[0]!.indexOf(t)]);
    expect(col('parentEventID')).toEqual(['', ...Array(6).fill(b.study.id)]);
    expect(col('sampleSizeValue').slice(1)).toEqual(Array(6).fill('0.25'));
    expect(col('sampleSizeUnit').slice(1)).toEqual(Array(6).fill('square metre'));
    expect(col('eventDate')[0]).toBe('2026-05-04T09:00:00+02:00/2026-05-04T09:06:00+02:00');
    expect(col('geodeticDatum').slice(1)).toEqual(
      ['WGS84', 'WGS84', 'WGS84', 'WGS84', 'WGS84', 'WGS84'].map((x, i) => (i === 2 ? '' : x)),
    );
    // accuracy 0 is not a valid coordinateUncertaintyInMeters: left empty
    expect(col('coordinateUncertaintyInMeters').slice(1)).toEqual(['4', '5', '', '8', '', '10']);
    expect(col('eventRemarks')[6]).toBe('stratum: wet; cluster: T2;  lead space');
  });
  it('refuses non-count studies and a missing taxon', async () => {
    const m = dwcTables(await measurementBundle());
    expect(m.ok).toBe(false);
    const st = study({ taxon: undefined });
    const nt = dwcTables(await makeBundle(st, entries(st, [1], 'x', 2)));
    expect(nt.ok === false && nt.message).toMatch(/taxon/);
  });
});
