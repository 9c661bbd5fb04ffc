/**
 * Lab results as Darwin Core occurrences (https://dwc.tdwg.org/terms/), one row per sample and taxon,
 * in RFC 4180 CSV (CRLF line ends; fields with a comma, quote or line break quoted, quotes doubled).
 */
import { csvCell } from '../../shared/csv.ts';
import type { ResultRow } from './lab.repository.ts';

export const DARWIN_CORE_COLUMNS = [
  'occurrenceID',
  'basisOfRecord',
  'eventID',
  'eventDate',
  'samplingProtocol',
  'minimumDepthInMeters',
  'maximumDepthInMeters',
  'scientificName',
  'occurrenceStatus',
  'organismQuantity',
  'organismQuantityType',
  'decimalLatitude',
  'decimalLongitude',
  'geodeticDatum',
  'locationID',
  'locality',
  'identifiedBy',
  'institutionCode',
  'occurrenceRemarks',
] as const;

/** One CSV field per RFC 4180, with text that would run as a spreadsheet formula neutralised. */
export const csvField = (value: string | number | null): string => csvCell(value);

const PROTOCOL = {
  hose: (top: number, bottom: number) => `integrated hose (tube) sample ${top}-${bottom} m, cells counted by sedimentation microscopy`,
  bottle: (top: number) => `discrete bottle sample at ${top} m, cells counted by sedimentation microscopy`,
};

export function darwinCoreRow(r: ResultRow): string[] {
  const below = r.cells_per_l < r.detection_limit;
  return [
    `urn:uuid:${r.id}`,
    'MaterialSample',
    r.sample_id,
    r.sampled_at.toISOString(),
    r.method === 'hose' ? PROTOCOL.hose(r.depth_top_m, r.depth_bottom_m) : PROTOCOL.bottle(r.depth_top_m),
    String(r.depth_top_m),
    String(r.depth_bottom_m),
    r.taxon,
    // A count under the detection limit is no evidence of presence.
    r.cells_per_l > 0 && !below ? 'present' : 'absent',
    String(r.cells_per_l),
    'cells per litre',
    String(r.latitude_deg),
    String(r.longitude_deg),
    'WGS84',
    r.site_id,
    r.site_name,
    r.analyst ?? '',
    r.lab ?? '',
    `detection limit ${r.detection_limit} cells per litre${below ? '; below the detection limit' : ''}`,
  ];
}

export function* darwinCoreLines(rows: readonly ResultRow[]): Generator<string> {
  yield `${DARWIN_CORE_COLUMNS.join(',')}\r\n`;
  for (const r of rows) yield `${darwinCoreRow(r).map(csvField).join(',')}\r\n`;
}
