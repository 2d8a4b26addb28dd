import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { Client, createTestApp, linkFromOutbox, makeJobBody, makeShop, memberWithRole, signUp, verifyEmail, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

let n = 0;
const address = () => `team-${++n}-${Date.now()}@example.test`;

/** Signs up at `email` (unverified), as an invited person would from the mail. */
async function signUpAt(email: string, name = 'Invited Person') {
  const client = new Client(t.url);
  const res = await client.post('/api/auth/sign-up/email', { name, email, password: 'correct-horse-9' });
  expect(res.status).toBe(200);
  return client;
}

const auditRows = (shopId: string, action: string) =>
  t.db
    .select()
    .from(schema.auditLog)
    .where(and(eq(schema.auditLog.shopId, shopId), eq(schema.auditLog.action, action)))
    .all();

describe('inviting staff', () => {
  it('mails an invitation, lists it as pending, and lets the invited tech join once verified, then work', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Invite shop');
    const email = address();
    const invited = await founder.post('/api/shop/invitations', { email, role: 'tech' });
    expect(invited.status).toBe(201);
    expect(invited.body.invitations).toEqual([expect.objectContaining({ email, role: 'tech', invitedBy: 'Invite shop founder' })]);
    expect(auditRows(shopId, 'invite')).toHaveLength(1);
    const link = new URL(linkFromOutbox(t.db, email, /invited you to Invite shop/));
    const invitationId = invited.body.invitations[0].id;
    expect(link.pathname).toBe(`/invitations/${invitationId}`);

    const tech = await signUpAt(email);
    // Before verification: signed in, the invitation is shown but cannot be taken up, and the shop stays closed.
    expect((await tech.get(`/api/invitations/${invitationId}`)).body).toMatchObject({
      shopName: 'Invite shop',
      role: 'tech',
      status: 'pending',
      verified: false,
    });
    expect((await tech.post(`/api/invitations/${invitationId}/accept`)).status).toBe(403);
    expect((await tech.get('/api/jobs')).status).toBe(403);

    await verifyEmail(t, tech, email);
    expect((await tech.get(`/api/invitations/${invitationId}`)).body).toMatchObject({ status: 'accepted', verified: true });
    const me = (await tech.get('/api/me')).body;
    expect(me.activeShop).toMatchObject({ id: shopId, role: 'tech' });
    expect((await tech.get('/api/jobs')).status).toBe(200);

    const team = (await founder.get('/api/shop/team')).body;
    expect(team.invitations).toEqual([]);
    expect(team.members.map((m: { email: string; role: string; you: boolean }) => [m.role, m.you])).toEqual(
      expect.arrayContaining([
        ['builder', true],
        ['tech', false],
      ]),
    );
    expect(team.roles).toEqual(['builder', 'tech']);
    expect(team.defaultRole).toBe('tech');
  });

  it('lets a person already signed up and verified accept from the invitation page, which opens the shop', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Accept shop');
    const person = await signUp(t, 'Second Builder');
    const invited = await founder.post('/api/shop/invitations', { email: person.email, role: 'builder' });
    const id = invited.body.invitations[0].id;
    expect((await person.get(`/api/invitations/${id}`)).body).toMatchObject({ status: 'pending', verified: true, role: 'builder' });
    const accepted = await person.post(`/api/invitations/${id}/accept`);
    expect(accepted.status).toBe(200);
    expect(accepted.body.status).toBe('accepted');
    expect((await person.get('/api/me')).body.activeShop).toMatchObject({ id: shopId, role: 'builder' });
    expect(auditRows(shopId, 'accept')).toHaveLength(1);
  });

  it('lets the invited person decline, which closes the invitation', async () => {
    const { founder } = await makeShop(t, 'repair', 'Decline shop');
    const person = await signUp(t, 'Not Joining');
    const id = (await founder.post('/api/shop/invitations', { email: person.email, role: 'tech' })).body.invitations[0].id;
    expect((await person.post(`/api/invitations/${id}/decline`)).body.status).toBe('rejected');
    expect((await founder.get('/api/shop/team')).body.invitations).toEqual([]);
    expect((await person.post(`/api/invitations/${id}/accept`)).status).toBe(400);
  });

  it('shows an invitation only to the address it was sent to', async () => {
    const { founder } = await makeShop(t, 'repair', 'Private invite shop');
    const id = (await founder.post('/api/shop/invitations', { email: address(), role: 'tech' })).body.invitations[0].id;
    const stranger = await signUp(t, 'Stranger');
    expect((await stranger.get(`/api/invitations/${id}`)).status).toBe(404);
    expect((await stranger.post(`/api/invitations/${id}/accept`)).status).toBe(404);
    expect((await new Client(t.url).get(`/api/invitations/${id}`)).status).toBe(401);
  });

  it('withdraws a pending invitation, after which verifying the address joins nothing', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Withdraw shop');
    const email = address();
    const id = (await founder.post('/api/shop/invitations', { email, role: 'tech' })).body.invitations[0].id;
    const withdrawn = await founder.delete(`/api/shop/invitations/${id}`);
    expect(withdrawn.status).toBe(200);
    expect(withdrawn.body.invitations).toEqual([]);
    expect(auditRows(shopId, 'withdraw')).toHaveLength(1);
    expect((await founder.delete(`/api/shop/invitations/${id}`)).status).toBe(409);
    const person = await signUpAt(email);
    await verifyEmail(t, person, email);
    expect((await person.get('/api/me')).body.shops).toEqual([]);
  });

  it('refuses roles the shop kind does not give, a bad address and a second invitation, each naming the field or reason', async () => {
    const { founder } = await makeShop(t, 'repair', 'Refusing shop');
    const grinderRole = await founder.post('/api/shop/invitations', { email: address(), role: 'grinder' });
    expect(grinderRole.status).toBe(400);
    expect(Object.keys(grinderRole.body.error.fields)).toEqual(['role']);
    const customerRole = await founder.post('/api/shop/invitations', { email: address(), role: 'customer' });
    expect(customerRole.status).toBe(400);
    const badEmail = await founder.post('/api/shop/invitations', { email: 'not an address', role: 'tech' });
    expect(badEmail.status).toBe(400);
    expect(Object.keys(badEmail.body.error.fields)).toEqual(['email']);
    const email = address();
    expect((await founder.post('/api/shop/invitations', { email, role: 'tech' })).status).toBe(201);
    const again = await founder.post('/api/shop/invitations', { email: email.toUpperCase(), role: 'tech' });
    expect(again.status).toBe(400);
    expect(again.body.error.message).toMatch(/already invited/i);
    const member = await founder.post('/api/shop/invitations', { email: founder.email, role: 'tech' });
    expect(member.status).toBe(400);
    expect(member.body.error.message).toMatch(/already a member/i);
  });

  it('lets a grinding shop invite grinders only', async () => {
    const { founder } = await makeShop(t, 'grinding', 'Grinding team');
    expect((await founder.post('/api/shop/invitations', { email: address(), role: 'grinder' })).status).toBe(201);
    expect((await founder.post('/api/shop/invitations', { email: address(), role: 'tech' })).status).toBe(400);
    const grindingTeam = (await founder.get('/api/shop/team')).body;
    expect(grindingTeam.roles).toEqual(['grinder']);
    expect(grindingTeam.defaultRole).toBe('grinder');
  });
});

describe('managing members', () => {
  it('changes a tech to a builder and back, with an audit row each time', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Role shop');
    const tech = await memberWithRole(t, shopId, 'tech');
    const memberId = (await founder.get('/api/shop/team')).body.members.find((m: { userId: string }) => m.userId === tech.userId).id;
    const promoted = await founder.patch(`/api/shop/members/${memberId}`, { role: 'builder' });
    expect(promoted.status).toBe(200);
    expect((await tech.get('/api/me')).body.activeShop.role).toBe('builder');
    expect((await tech.post('/api/jobs', makeJobBody())).status).toBe(201);
    await founder.patch(`/api/shop/members/${memberId}`, { role: 'tech' });
    expect((await tech.post('/api/jobs', makeJobBody())).status).toBe(403);
    expect(auditRows(shopId, 'change-role').map((r) => r.detail)).toEqual([
      { from: 'tech', to: 'builder' },
      { from: 'builder', to: 'tech' },
    ]);
  });

  it('removes a member, whose very next request is refused', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Remove shop');
    const tech = await memberWithRole(t, shopId, 'tech');
    expect((await tech.get('/api/jobs')).status).toBe(200);
    const memberId = (await founder.get('/api/shop/team')).body.members.find((m: { userId: string }) => m.userId === tech.userId).id;
    const removed = await founder.delete(`/api/shop/members/${memberId}`);
    expect(removed.status).toBe(200);
    expect(removed.body.members.map((m: { userId: string }) => m.userId)).not.toContain(tech.userId);
    const next = await tech.get('/api/jobs');
    expect(next.status).toBe(403);
    expect(next.body.error.message).toMatch(/no longer a member/);
    expect((await tech.get('/api/me')).body.shops).toEqual([]);
    expect(auditRows(shopId, 'remove')).toHaveLength(1);
  });

  it('refuses changing or removing yourself, and hides owners and other shops from the team', async () => {
    const { shopId, founder } = await makeShop(t, 'repair', 'Guarded shop');
    const other = await makeShop(t, 'repair', 'Other shop');
    const customer = await memberWithRole(t, shopId, 'customer');
    const team = (await founder.get('/api/shop/team')).body;
    expect(team.members.map((m: { userId: string }) => m.userId)).not.toContain(customer.userId);
    const self = team.members.find((m: { you: boolean }) => m.you).id;
    expect((await founder.delete(`/api/shop/members/${self}`)).status).toBe(403);
    expect((await founder.patch(`/api/shop/members/${self}`, { role: 'tech' })).status).toBe(403);
    const customerMember = t.db.select().from(schema.memberships).where(eq(schema.memberships.userId, customer.userId)).get()!;
    expect((await founder.delete(`/api/shop/members/${customerMember.id}`)).status).toBe(404);
    const otherFounder = (await other.founder.get('/api/shop/team')).body.members[0].id;
    expect((await founder.delete(`/api/shop/members/${otherFounder}`)).status).toBe(404);
    // A second builder may demote the founder; the one acting stays a builder, so the shop is never left without one.
    const second = await memberWithRole(t, shopId, 'builder');
    const founderId = (await second.get('/api/shop/team')).body.members.find((m: { userId: string }) => m.userId === founder.userId).id;
    expect((await second.patch(`/api/shop/members/${founderId}`, { role: 'tech' })).status).toBe(200);
    const secondId = (await second.get('/api/shop/team')).body.members.find((m: { you: boolean }) => m.you).id;
    expect((await second.patch(`/api/shop/members/${secondId}`, { role: 'tech' })).status).toBe(403);
    expect((await founder.get('/api/shop/team')).status).toBe(403);
  });

  it('gives techs, owners and a grinder placed in a repair shop no team screen', async () => {
    const { shopId } = await makeShop(t, 'repair', 'Closed team shop');
    for (const role of ['tech', 'customer', 'grinder'] as const) {
      const person = await memberWithRole(t, shopId, role);
      expect((await person.get('/api/shop/team')).status).toBe(403);
      expect((await person.post('/api/shop/invitations', { email: address(), role: 'tech' })).status).toBe(403);
    }
  });
});
