import { z } from 'zod';
import { BED_TYPE_KEYS } from '../bed-types.ts';
import { isoDateTimeSchema, timeZoneSchema, uuidSchema } from './common.schema.ts';

const metres = (label: string, min: number, max: number) =>
  z.number({ error: `${label} must be a number of metres` }).min(min, `${label} must be at least ${min} m`).max(max, `${label} must be at most ${max} m`);

const siteFields = z.object({
  name: z.string().trim().min(1, 'name is required').max(120, 'name must be at most 120 characters'),
  latitudeDeg: z.number({ error: 'latitude must be a number of degrees' }).min(-90, 'latitude must be between -90 and 90').max(90, 'latitude must be between -90 and 90'),
  longitudeDeg: z.number({ error: 'longitude must be a number of degrees' }).min(-180, 'longitude must be between -180 and 180').max(180, 'longitude must be between -180 and 180'),
  timeZone: timeZoneSchema,
  waterDepthM: metres('water depth', 0.5, 500),
  bedType: z.enum(BED_TYPE_KEYS, { error: `bed type must be one of ${BED_TYPE_KEYS.join(', ')}` }).nullable(),
  /** Nikuradse roughness ks in metres; required when no bed type is given. */
  bedRoughnessM: metres('bed roughness', 0.0001, 1).nullable(),
  /** Gear band, depths below the surface. */
  gearTopM: metres('gear top', 0, 500),
  gearBottomM: metres('gear bottom', 0, 500),
});

type SiteFields = z.infer<typeof siteFields>;

function checkSite(site: Partial<SiteFields>, ctx: z.core.$RefinementCtx<Partial<SiteFields>>) {
  if (site.bedType === null && site.bedRoughnessM === null) {
    ctx.addIssue({ code: 'custom', path: ['bedRoughnessM'], message: 'give a bed type or a bed roughness' });
  }
  if (site.gearTopM !== undefined && site.gearBottomM !== undefined && site.gearBottomM <= site.gearTopM) {
    ctx.addIssue({ code: 'custom', path: ['gearBottomM'], message: 'gear bottom must be deeper than gear top' });
  }
  if (site.gearBottomM !== undefined && site.waterDepthM !== undefined && site.gearBottomM > site.waterDepthM) {
    ctx.addIssue({ code: 'custom', path: ['gearBottomM'], message: 'gear bottom must not be deeper than the water depth' });
  }
}

export const siteInputSchema = siteFields
  .extend({ bedType: siteFields.shape.bedType.default(null), bedRoughnessM: siteFields.shape.bedRoughnessM.default(null) })
  .superRefine(checkSite);
export type SiteInput = z.infer<typeof siteInputSchema>;

/** A partial update; the merged site is checked again by the server. */
export const siteUpdateSchema = siteFields.partial().refine((v) => Object.keys(v).length > 0, { error: 'send at least one field to change' });
export type SiteUpdate = z.infer<typeof siteUpdateSchema>;
export const checkMergedSite = (site: SiteFields) => siteFields.superRefine(checkSite).safeParse(site);

export const siteSchema = siteFields.extend({
  id: uuidSchema,
  organisationId: uuidSchema,
  bedRoughnessM: z.number(),
  archivedAt: isoDateTimeSchema.nullable(),
  createdAt: isoDateTimeSchema,
  updatedAt: isoDateTimeSchema,
});
export type Site = z.infer<typeof siteSchema>;

export const siteListSchema = z.object({ sites: z.array(siteSchema) });
