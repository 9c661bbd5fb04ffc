import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { invitationPreviewSchema, meSchema } from '../../shared/schemas/team.schema.ts';
import { Browser } from '../helpers/browser.ts';
import { PASSWORD, startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

async function waitForMail(world: TeamWorld, to: string) {
  for (let i = 0; i < 50; i++) {
    const mail = world.smtp.messages().find((m) => m.to.includes(to));
    if (mail) return mail;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`No mail reached ${to}`);
}

describe('invitations by e-mail', () => {
  let world: TeamWorld;
  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => {
    await world.close();
  });

  it('mails a one-time link that gives the invited role, and refuses it the second time', async () => {
    const manager = await world.as('managerA');
    const sent = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/invitations`, { email: 'newcomer@alder.test', role: 'biologist' });
    expect(sent.status).toBe(201);

    const mail = await waitForMail(world, 'newcomer@alder.test');
    expect(mail.subject).toBe('Join Alder Shellfish on Planktide');
    const link = /https?:\/\/\S+\/invitations\/([A-Za-z0-9_-]+)/.exec(mail.text);
    expect(link, mail.text).not.toBeNull();
    expect(link![0].startsWith(world.baseUrl)).toBe(true);
    const token = link![1]!;

    const invitee = new Browser();
    await invitee.signIn(world.baseUrl, 'newcomer@alder.test', PASSWORD);
    const preview = await invitee.api(world.baseUrl, 'GET', `/invitations/${token}`);
    expect(invitationPreviewSchema.parse(preview.json)).toMatchObject({ organisationName: 'Alder Shellfish', role: 'biologist' });

    const accepted = await invitee.api(world.baseUrl, 'POST', `/invitations/${token}/accept`);
    expect(accepted.status).toBe(200);
    const me = meSchema.parse((await invitee.api(world.baseUrl, 'GET', '/me')).json);
    expect(me.memberships).toEqual([{ organisationId: world.orgA, organisationName: 'Alder Shellfish', role: 'biologist' }]);

    const again = await invitee.api(world.baseUrl, 'POST', `/invitations/${token}/accept`);
    expect(again.status).toBe(410);
    expect(apiErrorSchema.parse(again.json).error.message).toMatch(/already been used/);

    const audit = await world.database.db.selectFrom('audit_events').select('action').where('organisation_id', '=', world.orgA).execute();
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(['invitation.sent', 'invitation.accepted']));
  });

  it('refuses an expired link with a clear message and adds no member', async () => {
    const owner = await world.as('ownerA');
    await owner.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/invitations`, { email: 'second@alder.test', role: 'crew' });
    const mail = await waitForMail(world, 'second@alder.test');
    const token = /\/invitations\/([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;
    await world.database.db.updateTable('invitations').set({ expires_at: new Date(Date.now() - 1000) }).where('email', '=', 'second@alder.test').execute();

    const invitee = new Browser();
    await invitee.signIn(world.baseUrl, 'second@alder.test', PASSWORD);
    const answer = await invitee.api(world.baseUrl, 'POST', `/invitations/${token}/accept`);
    expect(answer.status).toBe(410);
    expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/expired/);
    expect(meSchema.parse((await invitee.api(world.baseUrl, 'GET', '/me')).json).memberships).toEqual([]);
  });

  it('refuses a link that was never issued', async () => {
    const invitee = new Browser();
    await invitee.signIn(world.baseUrl, 'second@alder.test', PASSWORD);
    const answer = await invitee.api(world.baseUrl, 'POST', `/invitations/${'x'.repeat(43)}/accept`);
    expect(answer.status).toBe(404);
    expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/not valid/);
  });

  it('lets a manager invite crew and biologists but not managers; owners may', async () => {
    const manager = await world.as('managerA');
    const refused = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/invitations`, { email: 'boss@alder.test', role: 'manager' });
    expect(refused.status).toBe(403);
    expect(apiErrorSchema.parse(refused.json).error.message).toMatch(/Only owners grant the manager and owner roles/);
    const owner = await world.as('ownerA');
    expect((await owner.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/invitations`, { email: 'boss@alder.test', role: 'manager' })).status).toBe(201);
  });

  it('makes no invitation when the mail service is down', async () => {
    await world.smtp.close();
    const before = await world.database.db.selectFrom('invitations').select('id').execute();
    const owner = await world.as('ownerA');
    const answer = await owner.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/invitations`, { email: 'late@alder.test', role: 'crew' });
    expect(answer.status).toBe(503);
    expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/could not be sent/);
    expect(await world.database.db.selectFrom('invitations').select('id').execute()).toHaveLength(before.length);
  });
});
