import { z } from 'zod';

export const ROLES = ['owner', 'manager', 'biologist', 'crew'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const uuidSchema = z.uuid({ error: 'must be an id (UUID)' });

/** An IANA time zone name that this runtime knows, e.g. "Europe/Oslo". */
export const timeZoneSchema = z.string().refine(
  (zone) => {
    try {
      new Intl.DateTimeFormat('en-GB', { timeZone: zone });
      return zone.includes('/') || zone === 'UTC';
    } catch {
      return false;
    }
  },
  { error: 'must be an IANA time zone such as "Europe/London"' },
);

export const isoDateTimeSchema = z.iso.datetime({ offset: true });
