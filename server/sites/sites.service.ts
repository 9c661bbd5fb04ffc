import { bedTypeRoughness } from '../../shared/bed-types.ts';
import { checkMergedSite, type Site, type SiteInput, type SiteUpdate } from '../../shared/schemas/site.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import { siteLimitFor } from '../billing/subscription-gate.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import type { CurrentUser } from '../http/request-context.ts';
import * as repo from './sites.repository.ts';

/** A bed type sets the roughness from its table value; without one, the given roughness is used. */
function roughness(site: Pick<SiteInput, 'bedType' | 'bedRoughnessM'>): number {
  if (site.bedType !== null) return bedTypeRoughness(site.bedType);
  if (site.bedRoughnessM !== null) return site.bedRoughnessM;
  throw new AppError('validation_failed', 'Give a bed type or a bed roughness.');
}

function uniqueName(error: unknown): never {
  if (error && typeof error === 'object' && 'constraint' in error && error.constraint === 'sites_org_name_unique') {
    throw new AppError('conflict', 'Another site of this organisation already has this name. Choose another name.');
  }
  throw error;
}

export async function createSite(db: Db, actor: CurrentUser, organisationId: string, input: SiteInput): Promise<Site> {
  return db
    .transaction()
    .execute(async (trx) => {
      // The plan sets how many active sites an organisation may have (none set before subscribing).
      const limit = await siteLimitFor(db, organisationId);
      if (limit !== null) {
        const active = await trx.selectFrom('sites').select((eb) => eb.fn.countAll<number>().as('n')).where('organisation_id', '=', organisationId).where('archived_at', 'is', null).executeTakeFirstOrThrow();
        if (Number(active.n) >= limit) {
          throw new AppError('conflict', `Your plan allows ${limit} active site(s). Archive a site or ask an owner to change the plan.`);
        }
      }
      const row = await repo.insertSite(trx, {
        organisation_id: organisationId,
        name: input.name,
        latitude_deg: input.latitudeDeg,
        longitude_deg: input.longitudeDeg,
        time_zone: input.timeZone,
        water_depth_m: input.waterDepthM,
        bed_type: input.bedType,
        bed_roughness_m: roughness(input),
        gear_top_m: input.gearTopM,
        gear_bottom_m: input.gearBottomM,
      });
      await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'site.created', subject: row.name, details: { siteId: row.id } });
      return repo.toSiteDto(row);
    })
    .catch(uniqueName);
}

export async function updateSite(db: Db, actor: CurrentUser, organisationId: string, siteId: string, changes: SiteUpdate): Promise<Site> {
  return db
    .transaction()
    .execute(async (trx) => {
      const current = await repo.findSite(trx, organisationId, siteId);
      if (!current) throw new AppError('not_found', 'No such site in this organisation.');
      const merged = { ...repo.toSiteDto(current), ...changes };
      // A roughness value given on its own replaces the bed type.
      if (changes.bedRoughnessM != null && changes.bedType === undefined) merged.bedType = null;
      const checked = checkMergedSite(merged);
      if (!checked.success) {
        const details = checked.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
        throw new AppError('validation_failed', `The site would have problems: ${details.map((d) => `${d.path}: ${d.message}`).join('; ')}.`, details);
      }
      const site = checked.data;
      const row = await repo.updateSite(trx, organisationId, siteId, {
        name: site.name,
        latitude_deg: site.latitudeDeg,
        longitude_deg: site.longitudeDeg,
        time_zone: site.timeZone,
        water_depth_m: site.waterDepthM,
        bed_type: site.bedType,
        bed_roughness_m: roughness(site),
        gear_top_m: site.gearTopM,
        gear_bottom_m: site.gearBottomM,
      });
      await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'site.updated', subject: row.name, details: { siteId, fields: Object.keys(changes) } });
      return repo.toSiteDto(row);
    })
    .catch(uniqueName);
}

export async function archiveSite(db: Db, actor: CurrentUser, organisationId: string, siteId: string): Promise<Site> {
  return db.transaction().execute(async (trx) => {
    const current = await repo.findSite(trx, organisationId, siteId);
    if (!current) throw new AppError('not_found', 'No such site in this organisation.');
    if (current.archived_at) return repo.toSiteDto(current);
    const row = await repo.updateSite(trx, organisationId, siteId, { archived_at: new Date() });
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'site.archived', subject: row.name, details: { siteId } });
    return repo.toSiteDto(row);
  });
}
