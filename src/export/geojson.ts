/**
 * The entries that have a position as GeoJSON (RFC 7946, Butler et al. 2016):
 * a FeatureCollection (§3.3) of Features (§3.2: "type", "geometry", "properties"; the event UUID as the
 * Feature "id") with Point geometries (§3.1.2) whose position is [longitude, latitude] (§3.1.1, §4:
 * WGS 84 decimal degrees). No "crs" member (§4 removed it from the format). The device's accuracy radius
 * is the property `accuracy_m`. Entries without a position are left out; voided entries are kept with
 * `status: "voided"` so a map shows the whole record (void records themselves carry no position).
 */
import type { Bundle } from '../bundle/bundle.ts';
import { statusOf } from '../bundle/events.ts';

export interface GeoJsonFeature {
  type: 'Feature';
  id: string;
  geometry: { type: 'Point'; coordinates: [number, number] };
  properties: Record<string, string | number | boolean | null>;
}

export interface GeoJsonFeatureCollection {
  type: 'FeatureCollection';
  features: GeoJsonFeature[];
}

export function entriesGeoJson(bundle: Bundle): GeoJsonFeatureCollection {
  const status = statusOf(bundle.events);
  const setup = bundle.study.setup;
  const features: GeoJsonFeature[] = [];
  for (const e of bundle.events) {
    if (!e.position || e.voids !== undefined) continue;
    const properties: Record<string, string | number | boolean | null> = {
      study_id: e.studyId,
      study_name: bundle.study.name,
      seq: e.seq,
      status: status.get(e.id) ?? 'counted',
      at: e.at,
      value: e.value ?? null,
      unit:
        setup.kind === 'count'
          ? 'individuals per plot'
          : setup.kind === 'pass-fail'
            ? '1 = counted outcome, 0 = not'
            : (setup.unit ?? null),
      accuracy_m: e.position.accuracyM,
      device: e.device,
    };
    if (e.censored !== undefined) properties.censored = e.censored;
    if (e.label !== undefined) properties.label = e.label;
    if (e.stratum !== undefined) properties.stratum = e.stratum;
    if (e.cluster !== undefined) properties.cluster = e.cluster;
    if (e.note !== undefined) properties.note = e.note;
    features.push({
      type: 'Feature',
      id: e.id,
      geometry: { type: 'Point', coordinates: [e.position.lon, e.position.lat] },
      properties,
    });
  }
  return { type: 'FeatureCollection', features };
}

/** GeoJSON text (two-space indent, final newline). */
export function geoJsonText(bundle: Bundle): string {
  return `${JSON.stringify(entriesGeoJson(bundle), null, 2)}\n`;
}
