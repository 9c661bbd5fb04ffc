import { gunzipSync } from 'node:zlib';
import { decodeGrid } from '../../shared/forecast/grid-codec.ts';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';
import { gridValueAtSample } from '../../shared/lab/sample-value.ts';
import { skill } from '../../shared/lab/skill.ts';
import type { ColumnMapping, Comparison, ComparisonPair, LabResult, LabResultInput, UploadPreview, UploadProblem, UploadResult } from '../../shared/schemas/lab.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { parseLabSheet, sheetProblems, type ParsedLabRow, type ParsedSheet } from './lab-csv.ts';
import * as repo from './lab.repository.ts';

const PREVIEW_ROWS = 20;

export const CENSORING_NOTE =
  'Counts below the detection limit (zero counts included) are taken as half the limit before logs are taken, a common practice for left-censored data; forecast values below the same limit are treated alike, so the model is not judged on differences the lab could not see.';

async function readSheet(db: Db, organisationId: string, text: string, mapping: ColumnMapping | null): Promise<ParsedSheet> {
  const sites = await repo.organisationSites(db, organisationId);
  const sheet = parseLabSheet(text, sites, mapping);
  // Results already stored (one per sample and taxon): a problem on the row, named like the others.
  const parsed = sheet.rows.flatMap((r) => (r.parsed ? [r.parsed] : []));
  const stored = await repo.storedSampleTaxa(db, organisationId, parsed.map((p) => p.sampleId));
  for (const r of sheet.rows) {
    if (!r.parsed) continue;
    const key = `${r.parsed.sampleId}\u0000${r.parsed.taxon.toLowerCase()}`;
    if (stored.has(key)) {
      const file = stored.get(key);
      r.problems.push({
        path: `row ${r.row}, column ${sheet.mapping.sampleId}`,
        row: r.row,
        column: sheet.mapping.sampleId ?? null,
        message: `sample ${r.parsed.sampleId} with taxon ${r.parsed.taxon} is stored already${file ? ` (from ${file})` : ''}; leave the row out or give the sample its own id`,
      });
      r.parsed = null;
    }
  }
  return sheet;
}

/** Columns, the mapping used and the first rows with their problems; nothing is stored. */
export async function previewUpload(db: Db, organisationId: string, fileName: string, text: string, mapping: ColumnMapping | null): Promise<UploadPreview> {
  const sheet = await readSheet(db, organisationId, text, mapping);
  const suggested = mapping ? parseLabSheet(text, [], null).mapping : sheet.mapping;
  return {
    fileName,
    columns: sheet.columns,
    suggestedMapping: suggested,
    mapping: sheet.mapping,
    rowCount: sheet.rows.length,
    rows: sheet.rows.slice(0, PREVIEW_ROWS).map((r) => ({ row: r.row, values: r.values as Record<string, string>, problems: r.problems })),
    fileProblems: sheet.fileProblems,
    rowsWithProblems: sheet.rows.filter((r) => r.problems.length > 0).length,
  };
}

function uploadError(problems: UploadProblem[], total: number): AppError {
  const shown = problems.slice(0, 5).map((p) => `${p.path}: ${p.message}`);
  const more = total > 5 ? ` (and ${total - 5} more)` : '';
  return new AppError(
    'validation_failed',
    `The file has ${total} problem${total > 1 ? 's' : ''}: ${shown.join('; ')}${more}. Nothing was imported; correct the file and upload it again.`,
    problems,
  );
}

const toInsert = (organisationId: string, uploadId: string, createdBy: string, r: Omit<ParsedLabRow, 'row'>) => ({
  organisation_id: organisationId,
  site_id: r.siteId,
  upload_id: uploadId,
  sample_id: r.sampleId,
  sampled_at: r.sampledAt,
  depth_top_m: r.depthTopM,
  depth_bottom_m: r.depthBottomM,
  method: r.method,
  taxon: r.taxon,
  cells_per_l: r.cellsPerL,
  detection_limit: r.detectionLimit,
  analyst: r.analyst,
  lab: r.lab,
  created_by: createdBy,
});

function duplicateToConflict(error: unknown): never {
  if (error && typeof error === 'object' && 'constraint' in error && error.constraint === 'lab_results_sample_taxon_unique') {
    throw new AppError('conflict', 'A result of this sample and taxon was stored meanwhile. Nothing was imported; upload the file again to see which rows.');
  }
  throw error;
}

/** Imports every row of the sheet in one transaction, or nothing when any row has a problem. */
export async function importUpload(db: Db, actor: { id: string }, organisationId: string, fileName: string, text: string, mapping: ColumnMapping | null): Promise<UploadResult> {
  const sheet = await readSheet(db, organisationId, text, mapping);
  const all = [...sheet.fileProblems, ...sheet.rows.flatMap((r) => r.problems)];
  if (all.length > 0) throw uploadError(sheetProblems({ ...sheet, fileProblems: all, rows: [] }), all.length);
  const rows = sheet.rows.map((r) => r.parsed!);
  const uploadId = await db
    .transaction()
    .execute(async (trx) => {
      const upload = await repo.insertUpload(trx, { organisationId, source: 'upload', fileName, rowCount: rows.length, createdBy: actor.id });
      await repo.insertResults(trx, rows.map(({ row: _row, ...r }) => toInsert(organisationId, upload.id, actor.id, r)));
      await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'lab.results_uploaded', subject: fileName, details: { uploadId: upload.id, rows: rows.length } });
      return upload.id;
    })
    .catch(duplicateToConflict);
  return { uploadId, fileName, imported: rows.length };
}

/** One result entered by hand. */
export async function addResult(db: Db, actor: { id: string }, organisationId: string, input: LabResultInput): Promise<LabResult> {
  const sites = await repo.organisationSites(db, organisationId);
  if (!sites.some((s) => s.id === input.siteId)) throw new AppError('validation_failed', 'siteId: no such site in this organisation. Choose one of its sites.', [{ path: 'siteId', message: 'no such site in this organisation' }]);
  const sampledAt = new Date(input.sampledAt);
  if (sampledAt.getTime() > Date.now() + 86_400_000) throw new AppError('validation_failed', 'sampledAt: the time is in the future; check the date and its zone.', [{ path: 'sampledAt', message: 'in the future' }]);
  const stored = await repo.storedSampleTaxa(db, organisationId, [input.sampleId]);
  if (stored.has(`${input.sampleId}\u0000${input.taxon.toLowerCase()}`)) {
    throw new AppError('conflict', `Sample ${input.sampleId} with taxon ${input.taxon} is stored already. Give the sample its own id.`);
  }
  const id = await db
    .transaction()
    .execute(async (trx) => {
      const upload = await repo.insertUpload(trx, { organisationId, source: 'manual', fileName: null, rowCount: 1, createdBy: actor.id });
      const [resultId] = await repo.insertResults(trx, [
        toInsert(organisationId, upload.id, actor.id, {
          siteId: input.siteId,
          sampleId: input.sampleId,
          sampledAt,
          depthTopM: input.depthTopM,
          depthBottomM: input.depthBottomM ?? input.depthTopM,
          method: input.method,
          taxon: input.taxon,
          cellsPerL: input.cellsPerL,
          detectionLimit: input.detectionLimit,
          analyst: input.analyst ?? null,
          lab: input.lab ?? null,
        }),
      ]);
      await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'lab.result_entered', subject: input.sampleId, details: { resultId, taxon: input.taxon } });
      return resultId!;
    })
    .catch(duplicateToConflict);
  const [row] = await repo.listResults(db, organisationId, { ids: [id] });
  return repo.toResultDto(row!);
}

/** Maps taxa to profiles (null removes a mapping). Every profile must be the organisation's. */
export async function setTaxonMappings(db: Db, actor: { id: string }, organisationId: string, mappings: { taxon: string; profileId: string | null }[]) {
  await db.transaction().execute(async (trx) => {
    const ids = [...new Set(mappings.flatMap((m) => (m.profileId ? [m.profileId] : [])))];
    const owned = ids.length ? await trx.selectFrom('organism_profiles').select('id').where('organisation_id', '=', organisationId).where('id', 'in', ids).execute() : [];
    if (owned.length !== ids.length) throw new AppError('validation_failed', 'mappings: every profileId must be an organism profile of this organisation.');
    for (const m of mappings) {
      if (m.profileId === null) await trx.deleteFrom('taxon_mappings').where('organisation_id', '=', organisationId).where('taxon', '=', m.taxon).execute();
      else {
        await trx
          .insertInto('taxon_mappings')
          .values({ organisation_id: organisationId, taxon: m.taxon, profile_id: m.profileId })
          .onConflict((oc) => oc.columns(['organisation_id', 'taxon']).doUpdateSet({ profile_id: m.profileId!, updated_at: new Date() }))
          .execute();
      }
    }
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'lab.taxa_mapped', subject: `${mappings.length} taxa`, details: { mappings } });
  });
  return { taxa: await repo.listTaxa(db, organisationId) };
}

interface ForecastChoice {
  id: string;
  profile_version_id: string;
  version: number;
  forecast_start: Date;
  horizon_days: number;
  created_at: Date;
}

/**
 * The forecast that was current when the sample was taken: the newest made at or before the sample
 * time whose span covers it; when none, the newest covering one (flagged as made after the sample).
 */
export function chooseForecast<T extends ForecastChoice>(forecasts: readonly T[], sampledAtMs: number): { forecast: T; madeAfter: boolean } | null {
  const covering = forecasts.filter((f) => f.forecast_start.getTime() <= sampledAtMs && sampledAtMs <= f.forecast_start.getTime() + f.horizon_days * 86_400_000);
  const newest = (list: T[]) => list.reduce<T | null>((best, f) => (!best || f.created_at > best.created_at || (f.created_at.getTime() === best.created_at.getTime() && f.forecast_start > best.forecast_start) ? f : best), null);
  const before = newest(covering.filter((f) => f.created_at.getTime() <= sampledAtMs));
  if (before) return { forecast: before, madeAfter: false };
  const after = newest(covering);
  return after ? { forecast: after, madeAfter: true } : null;
}

/** Each result of a taxon mapped to the profile against the forecast current at its sampling, with skill per version. */
export async function compare(db: Db, organisationId: string, profileId: string, siteId?: string): Promise<Comparison> {
  const profile = await repo.findProfile(db, organisationId, profileId);
  if (!profile) throw new AppError('not_found', 'No such organism profile in this organisation.');
  const taxa = await repo.mappedTaxa(db, organisationId, profileId);
  const results = taxa.length ? await repo.listResults(db, organisationId, { siteId, taxa }) : [];
  const forecastsBySite = new Map<string, Awaited<ReturnType<typeof repo.forecastsOf>>>();
  const grids = new Map<string, ForecastGrid>();
  const pairs: ComparisonPair[] = [];
  for (const r of [...results].sort((a, b) => a.sampled_at.getTime() - b.sampled_at.getTime())) {
    let forecasts = forecastsBySite.get(r.site_id);
    if (!forecasts) {
      forecasts = await repo.forecastsOf(db, organisationId, r.site_id, profileId);
      forecastsBySite.set(r.site_id, forecasts);
    }
    const choice = chooseForecast(forecasts, r.sampled_at.getTime());
    let value: number | null = null;
    if (choice) {
      let grid = grids.get(choice.forecast.id);
      if (!grid) {
        const bytes = await repo.forecastGridBytes(db, choice.forecast.id);
        if (bytes) {
          // A plain Uint8Array copy: decodeGrid slices its input, and Buffer.slice is a view of the whole buffer.
          grid = decodeGrid(new Uint8Array(gunzipSync(bytes)));
          grids.set(choice.forecast.id, grid);
        }
      }
      if (grid) value = gridValueAtSample(grid, { timeMs: r.sampled_at.getTime(), depthTopM: r.depth_top_m, depthBottomM: r.depth_bottom_m, method: r.method });
    }
    pairs.push({
      resultId: r.id,
      sampleId: r.sample_id,
      siteId: r.site_id,
      siteName: r.site_name,
      sampledAt: r.sampled_at.toISOString(),
      method: r.method,
      depthTopM: r.depth_top_m,
      depthBottomM: r.depth_bottom_m,
      taxon: r.taxon,
      observed: r.cells_per_l,
      detectionLimit: r.detection_limit,
      belowDetection: r.cells_per_l < r.detection_limit,
      forecast: value,
      forecastId: choice && value !== null ? choice.forecast.id : null,
      profileVersionId: choice && value !== null ? choice.forecast.profile_version_id : null,
      version: choice && value !== null ? choice.forecast.version : null,
      forecastMadeAfterSample: Boolean(choice?.madeAfter && value !== null),
    });
  }
  const matched = pairs.filter((p): p is ComparisonPair & { forecast: number; profileVersionId: string; version: number } => p.forecast !== null && p.profileVersionId !== null && p.version !== null);
  const versions = new Map<string, number>();
  for (const p of matched) versions.set(p.profileVersionId, p.version);
  const asSkill = (list: typeof matched) => skill(list.map((p) => ({ forecast: p.forecast, observed: p.observed, detectionLimit: p.detectionLimit })));
  return {
    profile,
    taxa,
    pairs,
    byVersion: [...versions.entries()]
      .sort((a, b) => a[1] - b[1])
      .map(([profileVersionId, version]) => ({ profileVersionId, version, skill: asSkill(matched.filter((p) => p.profileVersionId === profileVersionId)) })),
    overall: asSkill(matched),
    censoring: CENSORING_NOTE,
  };
}
