import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import type { Browser } from '../helpers/browser.ts';
import { fingerprint } from '../helpers/db-fingerprint.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';
import { uploadCsv } from '../server/tides-support.ts';

interface UploadCase {
  name: string;
  csv: string | Uint8Array;
  fields?: Record<string, string>;
  path: 'uploads/constituents' | 'sets/from-record';
  /** What the answer must say. */
  says: RegExp;
  status?: number;
}

const utf16 = (text: string) => {
  const bytes = new Uint8Array(2 + text.length * 2);
  bytes.set([0xff, 0xfe]);
  for (let i = 0; i < text.length; i++) bytes[2 + 2 * i] = text.charCodeAt(i);
  return bytes;
};

const GOOD_LEVEL = 'name,amplitude,phase_deg\nM2,1.2,100\nS2,0.4,130\n';

const UPLOADS: UploadCase[] = [
  { name: 'a file in UTF-16 instead of UTF-8', csv: utf16(GOOD_LEVEL), fields: { kind: 'level' }, path: 'uploads/constituents', says: /UTF-8|encoding|column/i },
  { name: 'Latin-1 bytes that are not UTF-8', csv: new Uint8Array([...new TextEncoder().encode('name,amplitude,phase_deg\nM2,1.2,100\n'), 0xe9, 0x0a]), fields: { kind: 'level' }, path: 'uploads/constituents', says: /UTF-8|row|name/i },
  { name: 'an unknown delimiter', csv: 'name:amplitude:phase_deg\nM2:1.2:100\n', fields: { kind: 'level' }, path: 'uploads/constituents', says: /column/i },
  { name: 'a missing column', csv: 'name,amplitude\nM2,1.2\n', fields: { kind: 'level' }, path: 'uploads/constituents', says: /phase/i },
  { name: 'a spreadsheet formula in a number cell', csv: 'name,amplitude,phase_deg\nM2,=1+2,100\n', fields: { kind: 'level' }, path: 'uploads/constituents', says: /row 2/i },
  { name: 'a formula in the name cell', csv: 'name,amplitude,phase_deg\n=HYPERLINK("http://x"),1.2,100\n', fields: { kind: 'level' }, path: 'uploads/constituents', says: /row 2/i },
  { name: 'an amplitude out of range', csv: 'name,amplitude,phase_deg\nM2,-3,100\n', fields: { kind: 'level' }, path: 'uploads/constituents', says: /row 2/i },
  { name: 'an unknown constituent', csv: 'name,amplitude,phase_deg\nZZ9,1,100\n', fields: { kind: 'level' }, path: 'uploads/constituents', says: /ZZ9/ },
  { name: 'a huge file', csv: 'name,amplitude,phase_deg\n' + 'M2,1.2,100\n'.repeat(900_000), fields: { kind: 'level' }, path: 'uploads/constituents', says: /large|MB|limit/i, status: 413 },
  { name: 'a record whose times carry no zone', csv: 'time,u_m_s,v_m_s\n2026-01-01 00:00,0.1,0.0\n2026-01-01 00:10,0.2,0.0\n', path: 'sets/from-record', says: /zone|offset/i },
  { name: 'an empty file', csv: '', fields: { kind: 'level' }, path: 'uploads/constituents', says: /empty|no rows|column/i },
];

interface BodyCase {
  name: string;
  method: 'POST' | 'PATCH' | 'PUT';
  path: (w: TeamWorld) => string;
  body: unknown;
  says: RegExp;
}

const BODIES: BodyCase[] = [
  { name: 'a site with a string for its depth', method: 'POST', path: (w) => `/orgs/${w.orgA}/sites`, body: { name: 'X', latitudeDeg: 57, longitudeDeg: -6, timeZone: 'Europe/London', waterDepthM: '12', bedType: 'mud', gearTopM: 1, gearBottomM: 6 }, says: /waterDepthM/ },
  { name: 'a site at latitude 95', method: 'POST', path: (w) => `/orgs/${w.orgA}/sites`, body: { name: 'X', latitudeDeg: 95, longitudeDeg: -6, timeZone: 'Europe/London', waterDepthM: 12, bedType: 'mud', gearTopM: 1, gearBottomM: 6 }, says: /latitude must be between -90 and 90/ },
  { name: 'an array instead of an object', method: 'POST', path: (w) => `/orgs/${w.orgA}/sites`, body: [1, 2, 3], says: /request body/ },
  { name: 'a profile with a negative trigger', method: 'POST', path: (w) => `/orgs/${w.orgA}/profiles`, body: { name: 'P', taxon: 'T', params: { settlingVelocityMPerDay: 1, initialCellsPerL: 10, triggerCellsPerL: -5 } }, says: /triggerCellsPerL/ },
  { name: 'an invitation to a non-address', method: 'POST', path: (w) => `/orgs/${w.orgA}/invitations`, body: { email: 'not-an-address', role: 'crew' }, says: /email: must be an e-mail address/ },
  { name: 'a role that does not exist', method: 'PATCH', path: (w) => `/orgs/${w.orgA}/members/${w.userIds.crewA}`, body: { role: 'admiral' }, says: /role/ },
  { name: 'mail settings with a time of 25:00', method: 'PUT', path: () => '/me/mail-settings', body: { digestEnabled: true, digestLocalTime: '25:00', timeZone: 'Europe/London', alertsEnabled: true }, says: /digestLocalTime: must be a time HH:MM/ },
];

describe('bad input: a clear 4xx naming what is wrong, and the database unchanged', () => {
  let world: TeamWorld;
  let manager: Browser;
  let owner: Browser;
  let tmp: string;
  const tmpBefore = process.env.TMPDIR;
  beforeAll(async () => {
    // Uploads must stay in memory: a folder of our own as the temporary folder, to find any file written.
    tmp = mkdtempSync(path.join(os.tmpdir(), 'planktide-uploads-'));
    process.env.TMPDIR = tmp;
    world = await startTeamWorld();
    manager = await world.as('managerA');
    owner = await world.as('ownerA');
  }, 60_000);
  afterAll(async () => {
    await world.close();
    if (tmpBefore === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = tmpBefore;
    rmSync(tmp, { recursive: true, force: true });
  });

  for (const c of UPLOADS) {
    it(`refuses ${c.name} in a tides upload`, async () => {
      const before = await fingerprint(world.database.db);
      const answer = await uploadCsv(manager, world.baseUrl, `/orgs/${world.orgA}/sites/${world.siteA}/tides/${c.path}`, c.csv as string, c.fields ?? {});
      expect(answer.status).toBe(c.status ?? 400);
      expect(apiErrorSchema.parse(answer.json).error.message).toMatch(c.says);
      expect(await fingerprint(world.database.db)).toEqual(before);
    }, 60_000);
  }

  for (const c of BODIES) {
    it(`refuses ${c.name}`, async () => {
      const before = await fingerprint(world.database.db);
      const answer = await owner.api(world.baseUrl, c.method, c.path(world), c.body);
      expect(answer.status).toBe(400);
      expect(apiErrorSchema.parse(answer.json).error.message).toMatch(c.says);
      expect(await fingerprint(world.database.db)).toEqual(before);
    });
  }

  it('refuses a JSON body over the 1 MB limit with 413', async () => {
    const before = await fingerprint(world.database.db);
    const answer = await owner.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites`, { name: 'x'.repeat(1_100_000) });
    expect(answer.status).toBe(413);
    expect(await fingerprint(world.database.db)).toEqual(before);
  });

  it('keeps every upload in memory: nothing is written to the temporary folder', async () => {
    const biologist = await world.as('biologistA');
    const lab = await uploadCsv(biologist, world.baseUrl, `/orgs/${world.orgA}/lab/uploads/preview`, 'sample_id,sampled_at,depth_m,taxon,cells_per_l\nS1,2026-12-01T08:00:00Z,3,Alexandrium sp.,1200\n');
    expect(lab.status).toBeLessThan(500);
    const tides = await uploadCsv(manager, world.baseUrl, `/orgs/${world.orgA}/sites/${world.siteA}/tides/uploads/constituents`, 'constituent,amplitude_m,phase_deg\nM2,1.2,40\n');
    expect(tides.status).toBeLessThan(500);
    expect(os.tmpdir()).toBe(tmp);
    expect(readdirSync(tmp)).toEqual([]);
  });
});
