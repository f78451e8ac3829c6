/**
 * Users and access: invitations and password reset through the real fake SMTP server (MailDev,
 * started by scripts/test.sh; its REST API is read here), roles, owner grants and their
 * revocation through the sync `revoked` list, and "send report to owner" with the PDF attached.
 */
import assert from 'node:assert/strict';
import bcrypt from 'bcryptjs';
import { after, before, beforeEach, describe, it } from 'node:test';
import request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { SCHEMA_VERSION } from '../../shared/sync';
import { hashToken } from '../../server/services/access';
import { demoIds, startApp, type TestContext } from './context';

const INBOX = process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:54342';

interface Mail {
  id: string;
  subject: string;
  text: string;
  to: { address: string }[];
  attachments?: { fileName?: string; generatedFileName?: string; contentType: string; length?: number }[];
}

async function inbox(): Promise<Mail[]> {
  const res = await fetch(`${INBOX}/email`);
  assert.equal(res.status, 200, 'the fake inbox answers');
  return (await res.json()) as Mail[];
}

/** The newest message to `to`, waiting up to 5 s (the reset e-mail is sent after the answer). */
// a ceiling, not a wait: it returns the moment the e-mail is there (a busy machine is slow to send)
async function mailTo(to: string, timeoutMs = 30_000): Promise<Mail> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const mails = (await inbox()).filter((m) => m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()));
    if (mails.length) return mails[mails.length - 1];
    if (Date.now() > end) throw new Error(`no e-mail to ${to} in ${INBOX}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function noMailTo(to: string, waitMs = 1000): Promise<void> {
  await new Promise((r) => setTimeout(r, waitMs));
  const mails = (await inbox()).filter((m) => m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()));
  assert.equal(mails.length, 0, `no e-mail to ${to}`);
}

function linkIn(mail: Mail, path: 'invitation' | 'reset-password'): string {
  const match = mail.text.match(new RegExp(`https?://\\S+/${path}/([A-Za-z0-9_-]+)`));
  assert.ok(match, `a /${path}/ link in: ${mail.text}`);
  return match[1];
}

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let admin: request.Agent;
let orgId: string;
const unique = () => `person-${uuidv7().slice(-12)}@example.test`;

/** A user made straight in the database, signed in. */
async function makeUser(email: string, organisationId: string, role: string) {
  const id = uuidv7();
  await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Made in test', $3)`, [
    id,
    email,
    await bcrypt.hash('made-in-test', 4),
  ]);
  await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, $4)`, [uuidv7(), id, organisationId, role]);
  const agent = request.agent(ctx.app);
  await agent.post('/api/auth/sign-in').send({ email, password: 'made-in-test' }).expect(200);
  return { id, email, agent };
}

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  admin = await ctx.signIn('admin');
  const [clinic] = await ctx.ds.query(`SELECT organisation_id FROM building WHERE id = $1`, [ids.clinicId]);
  orgId = clinic.organisation_id;
  await fetch(`${INBOX}/email/all`, { method: 'DELETE' });
});
after(() => ctx.close());

describe('invitations', () => {
  it('an invited electrician gets the e-mail, sets a password and is signed in; the link works once', async () => {
    const email = unique();
    const res = await admin.post(`/api/organisations/${orgId}/invitations`).send({ email, role: 'electrician' }).expect(201);
    assert.equal(res.body.outcome, 'invited');
    const mail = await mailTo(email);
    assert.match(mail.subject, /Invitation/);
    const token = linkIn(mail, 'invitation');

    // only the hash is stored
    const [row] = await ctx.ds.query(`SELECT token_hash FROM invitation WHERE email = $1`, [email]);
    assert.equal(row.token_hash, hashToken(token));
    assert.equal((await ctx.ds.query(`SELECT 1 FROM invitation WHERE token_hash = $1`, [token])).length, 0);

    const view = await request(ctx.app).get(`/api/invitations/${token}`).expect(200);
    assert.equal(view.body.email, email);
    assert.equal(view.body.role, 'electrician');

    const agent = request.agent(ctx.app);
    const bad = await agent.post(`/api/invitations/${token}/accept`).send({ name: '', password: 'short' }).expect(400);
    assert.ok(bad.body.error.fields.name, 'a per-field error for the name');
    assert.match(bad.body.error.fields.password, /10 characters/);

    await agent.post(`/api/invitations/${token}/accept`).send({ name: 'Nia Okafor', password: 'a-long-password' }).expect(201);
    const me = await agent.get('/api/me').expect(200);
    assert.equal(me.body.user.email, email);
    assert.equal(me.body.memberships[0].role, 'electrician');

    const again = await request(ctx.app).post(`/api/invitations/${token}/accept`).send({ name: 'X', password: 'another-long-one' }).expect(410);
    assert.equal(again.body.error.code, 'used');
    assert.match((await request(ctx.app).get(`/api/invitations/${token}`).expect(410)).body.error.message, /already been used/);
    // and the password works for a normal sign-in
    await request(ctx.app).post('/api/auth/sign-in').send({ email, password: 'a-long-password' }).expect(200);
  });

  it('an expired invitation says so plainly', async () => {
    const email = unique();
    await admin.post(`/api/organisations/${orgId}/invitations`).send({ email, role: 'inspector' }).expect(201);
    const token = linkIn(await mailTo(email), 'invitation');
    // the clock: 7 days later
    await ctx.ds.query(`UPDATE invitation SET expires_at = now() - interval '1 second' WHERE token_hash = $1`, [hashToken(token)]);
    const res = await request(ctx.app).get(`/api/invitations/${token}`).expect(410);
    assert.equal(res.body.error.code, 'expired');
    assert.match(res.body.error.message, /expired/);
    await request(ctx.app).post(`/api/invitations/${token}/accept`).send({ name: 'Late', password: 'a-long-password' }).expect(410);
  });

  it('invites expire after 7 days', async () => {
    const email = unique();
    await admin.post(`/api/organisations/${orgId}/invitations`).send({ email, role: 'inspector' }).expect(201);
    const [row] = await ctx.ds.query(`SELECT extract(epoch FROM expires_at - created_at) AS s FROM invitation WHERE email = $1`, [email]);
    assert.ok(Math.abs(Number(row.s) - 7 * 24 * 3600) < 60);
  });

  it('an owner invitation grants the named buildings only', async () => {
    const email = unique();
    const missing = await admin.post(`/api/organisations/${orgId}/invitations`).send({ email, role: 'owner' }).expect(400);
    assert.ok(missing.body.error.fields.buildingIds);
    await admin.post(`/api/organisations/${orgId}/invitations`).send({ email, role: 'owner', buildingIds: [ids.loftsId] }).expect(201);
    const token = linkIn(await mailTo(email), 'invitation');
    const owner = request.agent(ctx.app);
    await owner.post(`/api/invitations/${token}/accept`).send({ name: 'Lofts Owner', password: 'a-long-password' }).expect(201);
    const list = await owner.get('/api/buildings').expect(200);
    assert.deepEqual(list.body.buildings.map((b: { id: string }) => b.id), [ids.loftsId]);
    await owner.get(`/api/buildings/${ids.clinicId}`).expect(404);
  });

  it('an address that has an account gets the same answer as a new one, and an invitation it must accept', async () => {
    // another organisation with its own admin, and a person who already has an account here
    const secondOrg = uuidv7();
    await ctx.ds.query(`INSERT INTO organisation (id, name) VALUES ($1, 'Second organisation for access')`, [secondOrg]);
    const otherAdmin = await makeUser(unique(), secondOrg, 'admin');
    const existing = await makeUser(unique(), orgId, 'electrician');
    const fresh = unique();
    const url = `/api/organisations/${secondOrg}/invitations`;
    const forExisting = await otherAdmin.agent.post(url).send({ email: existing.email, role: 'inspector' });
    const forFresh = await otherAdmin.agent.post(url).send({ email: fresh, role: 'inspector' });
    // the same status, body shape and words (but for the address): nothing tells the admin which had an account
    assert.equal(forExisting.status, 201);
    assert.equal(forFresh.status, forExisting.status);
    assert.deepEqual(Object.keys(forExisting.body).sort(), Object.keys(forFresh.body).sort());
    assert.equal(forExisting.body.outcome, forFresh.body.outcome);
    assert.equal(forExisting.body.message.replace(existing.email, 'X'), forFresh.body.message.replace(fresh, 'X'));
    // nothing changed for the account until it accepts
    const [before] = await ctx.ds.query(`SELECT count(*)::int AS n FROM membership WHERE user_id = $1 AND organisation_id = $2`, [existing.id, secondOrg]);
    assert.equal(before.n, 0, 'no membership before the account accepts');
    const mail = await mailTo(existing.email);
    assert.match(mail.subject, /Invitation/);
    const token = linkIn(mail, 'invitation');
    // the link's page asks the existing account for its password, not for a new one
    const view = await request(ctx.app).get(`/api/invitations/${token}`).expect(200);
    assert.equal(view.body.account, 'existing');
    const wrong = await request(ctx.app).post(`/api/invitations/${token}/accept`).send({ password: 'not-the-password' }).expect(400);
    assert.ok(wrong.body.error.fields.password);
    const agent = request.agent(ctx.app);
    await agent.post(`/api/invitations/${token}/accept`).send({ password: 'made-in-test' }).expect(201);
    const me = await agent.get('/api/me').expect(200);
    assert.equal(me.body.user.id, existing.id, 'signed in as the existing account, not a new one');
    assert.ok(me.body.memberships.some((m: { organisationId: string; role: string }) => m.organisationId === secondOrg && m.role === 'inspector'));
    assert.ok(me.body.memberships.some((m: { organisationId: string }) => m.organisationId === orgId), 'the first membership stays');
    // the password did not change
    await request(ctx.app).post('/api/auth/sign-in').send({ email: existing.email, password: 'made-in-test' }).expect(200);
    await request(ctx.app).post(`/api/invitations/${token}/accept`).send({ password: 'made-in-test' }).expect(410);

    const dup = await otherAdmin.agent.post(url).send({ email: existing.email, role: 'admin' }).expect(409);
    assert.equal(dup.body.error.code, 'already_member');
    // an admin of one organisation manages only that one
    await otherAdmin.agent.get(`/api/organisations/${orgId}/people`).expect(404);
  });

  it('an existing account signed in as itself accepts with one click; signed in as someone else it must give the password', async () => {
    const thirdOrg = uuidv7();
    await ctx.ds.query(`INSERT INTO organisation (id, name) VALUES ($1, 'Third organisation for access')`, [thirdOrg]);
    const thirdAdmin = await makeUser(unique(), thirdOrg, 'admin');
    const existing = await makeUser(unique(), orgId, 'inspector');
    await thirdAdmin.agent.post(`/api/organisations/${thirdOrg}/invitations`).send({ email: existing.email, role: 'electrician' }).expect(201);
    const token = linkIn(await mailTo(existing.email), 'invitation');
    // someone else's session does not accept for the account
    const other = await makeUser(unique(), orgId, 'inspector');
    const refused = await other.agent.post(`/api/invitations/${token}/accept`).send({});
    assert.equal(refused.status, 400, JSON.stringify(refused.body));
    assert.ok(refused.body.error.fields.password);
    await existing.agent.post(`/api/invitations/${token}/accept`).send({}).expect(201);
    const me = await existing.agent.get('/api/me').expect(200);
    assert.ok(me.body.memberships.some((m: { organisationId: string; role: string }) => m.organisationId === thirdOrg && m.role === 'electrician'));
  });
});

describe('roles: only admins manage people', () => {
  for (const role of ['electrician', 'inspector', 'owner'] as const) {
    it(`${role}: may not list, invite, change or remove`, async () => {
      const agent = await ctx.signIn(role);
      const [electricianUser] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`);
      await agent.get(`/api/organisations/${orgId}/people`).expect(403);
      await agent.post(`/api/organisations/${orgId}/invitations`).send({ email: unique(), role: 'admin' }).expect(403);
      await agent.patch(`/api/organisations/${orgId}/people/${electricianUser.id}`).send({ role: 'admin' }).expect(403);
      await agent.delete(`/api/organisations/${orgId}/people/${electricianUser.id}`).expect(403);
    });
  }

  it('another organisation answers 404', async () => {
    await admin.get(`/api/organisations/${uuidv7()}/people`).expect(404);
  });

  it('admin: lists people, changes a role, removes someone; not themselves, not the last admin', async () => {
    const people = await admin.get(`/api/organisations/${orgId}/people`).expect(200);
    const byEmail = new Map(people.body.people.map((p: { email: string; userId: string }) => [p.email, p]));
    const me = byEmail.get('admin@ampwright.test') as { userId: string };
    assert.ok(byEmail.has('owner@ampwright.test'));

    const self = await admin.delete(`/api/organisations/${orgId}/people/${me.userId}`).expect(409);
    assert.equal(self.body.error.code, 'self');
    const demote = await admin.patch(`/api/organisations/${orgId}/people/${me.userId}`).send({ role: 'inspector' }).expect(409);
    assert.equal(demote.body.error.code, 'last_admin');

    // a fresh person to change and remove
    const email = unique();
    await admin.post(`/api/organisations/${orgId}/invitations`).send({ email, role: 'inspector' }).expect(201);
    const token = linkIn(await mailTo(email), 'invitation');
    const person = request.agent(ctx.app);
    const accepted = await person.post(`/api/invitations/${token}/accept`).send({ name: 'Temp', password: 'a-long-password' }).expect(201);
    const userId = accepted.body.userId as string;

    await admin.patch(`/api/organisations/${orgId}/people/${userId}`).send({ role: 'electrician' }).expect(200);
    // takes effect at once: the actor is loaded per request
    const meAfter = await person.get('/api/me').expect(200);
    assert.equal(meAfter.body.memberships[0].role, 'electrician');
    await admin.delete(`/api/organisations/${orgId}/people/${userId}`).expect(200);
    const gone = await person.get('/api/me').expect(200);
    assert.equal(gone.body.memberships.length, 0);
    await person.get(`/api/buildings/${ids.clinicId}`).expect(404);
  });
});

describe('owner grants and revocation', () => {
  it('an owner cannot read a building not granted, before or after revocation; the pull lists it in revoked', async () => {
    const owner = await ctx.signIn('owner');
    const [ownerUser] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'owner@ampwright.test'`);
    const deviceId = `test-${uuidv7()}`;
    await owner.get(`/api/buildings/${ids.loftsId}`).expect(404); // before: never granted

    await admin.post(`/api/organisations/${orgId}/people/${ownerUser.id}/buildings/${ids.loftsId}`).expect(200);
    await owner.get(`/api/buildings/${ids.loftsId}`).expect(200);
    const first = await owner.post('/api/sync/pull').send({ deviceId, schemaVersion: SCHEMA_VERSION, cursors: {} }).expect(200);
    const cursors: Record<string, number> = {};
    for (const page of first.body.buildings) cursors[page.buildingId] = page.toVersion;
    assert.ok(ids.loftsId in cursors, 'the granted building is pulled');

    await admin.delete(`/api/organisations/${orgId}/people/${ownerUser.id}/buildings/${ids.loftsId}`).expect(200);
    await owner.get(`/api/buildings/${ids.loftsId}`).expect(404); // after: at once
    await owner.get(`/api/panels/${ids.loftsPanelId}`).expect(404);
    const next = await owner.post('/api/sync/pull').send({ deviceId, schemaVersion: SCHEMA_VERSION, cursors }).expect(200);
    assert.deepEqual(next.body.revoked, [ids.loftsId]);
    assert.ok(!next.body.buildings.some((b: { buildingId: string }) => b.buildingId === ids.loftsId));
    // the clinic stays
    await owner.get(`/api/buildings/${ids.clinicId}`).expect(200);
  });

  it('grants are for owners only and within the organisation', async () => {
    const [electricianUser] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`);
    const res = await admin.post(`/api/organisations/${orgId}/people/${electricianUser.id}/buildings/${ids.loftsId}`).expect(409);
    assert.equal(res.body.error.code, 'not_owner');
    const [ownerUser] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'owner@ampwright.test'`);
    await admin.post(`/api/organisations/${orgId}/people/${ownerUser.id}/buildings/${uuidv7()}`).expect(404);
  });
});

describe('password reset', () => {
  beforeEach(async () => {
    await fetch(`${INBOX}/email/all`, { method: 'DELETE' });
  });

  it('the same answer whether or not the account exists, and an e-mail only for a real one', async () => {
    // the answer goes before the look-up and the e-mail, so it cannot take longer for a real
    // account. Shown without a clock (a busy machine makes timings lie): while the work for a real
    // account is held up — its reset links locked by another transaction — the answer still comes,
    // and the e-mail only once the lock is gone
    const held = ctx.ds.createQueryRunner();
    await held.connect();
    await held.startTransaction();
    let known: request.Response;
    let unknown: request.Response;
    try {
      await held.query('LOCK TABLE one_time_token IN EXCLUSIVE MODE');
      const ask = (email: string) =>
        request(ctx.app).post('/api/auth/forgot-password').timeout(60_000).send({ email }).expect(200);
      known = await ask('inspector@ampwright.test');
      unknown = await ask('nobody@example.test');
      await noMailTo('inspector@ampwright.test');
    } finally {
      await held.rollbackTransaction();
      await held.release();
    }
    assert.deepEqual(known.body, unknown.body);
    await mailTo('inspector@ampwright.test');
    await noMailTo('nobody@example.test');
  });

  it('the link sets a new password once; the old password stops working; other sessions end', async () => {
    const email = unique();
    await admin.post(`/api/organisations/${orgId}/invitations`).send({ email, role: 'inspector' }).expect(201);
    const invitationToken = linkIn(await mailTo(email), 'invitation');
    const elsewhere = request.agent(ctx.app);
    await elsewhere.post(`/api/invitations/${invitationToken}/accept`).send({ name: 'Resetter', password: 'first-password' }).expect(201);

    await request(ctx.app).post('/api/auth/forgot-password').send({ email }).expect(200);
    const mail = await (async () => {
      for (let i = 0; i < 50; i++) {
        const m = (await inbox()).find((x) => x.to.some((t) => t.address === email) && /new Ampwright password/.test(x.subject));
        if (m) return m;
        await new Promise((r) => setTimeout(r, 100));
      }
      throw new Error('no reset e-mail');
    })();
    const token = linkIn(mail, 'reset-password');
    const [row] = await ctx.ds.query(`SELECT extract(epoch FROM expires_at - created_at) AS s, token_hash FROM one_time_token WHERE token_hash = $1`, [hashToken(token)]);
    assert.ok(Math.abs(Number(row.s) - 3600) < 60, 'expires in one hour');

    await request(ctx.app).get(`/api/password-resets/${token}`).expect(200);
    const short = await request(ctx.app).post(`/api/password-resets/${token}`).send({ password: 'short' }).expect(400);
    assert.match(short.body.error.fields.password, /10 characters/);
    const agent = request.agent(ctx.app);
    await agent.post(`/api/password-resets/${token}`).send({ password: 'second-password' }).expect(200);
    await agent.get('/api/me').expect(200); // signed in
    assert.equal((await elsewhere.get('/api/me').expect(200)).body.user, null); // the other session ended
    await request(ctx.app).post('/api/auth/sign-in').send({ email, password: 'first-password' }).expect(401);
    await request(ctx.app).post('/api/auth/sign-in').send({ email, password: 'second-password' }).expect(200);
    const again = await request(ctx.app).post(`/api/password-resets/${token}`).send({ password: 'third-password' }).expect(410);
    assert.equal(again.body.error.code, 'used');
  });

  it('an expired reset link says so', async () => {
    await request(ctx.app).post('/api/auth/forgot-password').send({ email: 'electrician@ampwright.test' }).expect(200);
    const token = linkIn(await mailTo('electrician@ampwright.test'), 'reset-password');
    await ctx.ds.query(`UPDATE one_time_token SET expires_at = now() - interval '1 second' WHERE token_hash = $1`, [hashToken(token)]);
    const res = await request(ctx.app).post(`/api/password-resets/${token}`).send({ password: 'a-long-password' }).expect(410);
    assert.equal(res.body.error.code, 'expired');
    await request(ctx.app).post('/api/auth/sign-in').send({ email: 'electrician@ampwright.test', password: 'ampwright-demo' }).expect(200);
  });

  it('is rate-limited like sign-in', async () => {
    const limited = await startApp({ signInLimit: 2 });
    try {
      const email = 'nobody-limit@example.test';
      await request(limited.app).post('/api/auth/forgot-password').send({ email }).expect(200);
      await request(limited.app).post('/api/auth/forgot-password').send({ email }).expect(200);
      const res = await request(limited.app).post('/api/auth/forgot-password').send({ email }).expect(429);
      assert.equal(res.body.error.code, 'too_many_attempts');
    } finally {
      await limited.close();
    }
  });
});

describe('send report to owner', () => {
  it('e-mails the PDF to the owners granted the building; owners and electricians may not send', async () => {
    await fetch(`${INBOX}/email/all`, { method: 'DELETE' });
    const [inspection] = await ctx.ds.query(
      `SELECT id FROM inspection WHERE building_id = $1 AND deleted_at IS NULL ORDER BY performed_on LIMIT 1`,
      [ids.clinicId],
    );
    assert.ok(inspection, 'the demo clinic has an inspection');
    await (await ctx.signIn('owner')).post(`/api/inspections/${inspection.id}/send-report`).send({}).expect(403);
    await (await ctx.signIn('electrician')).post(`/api/inspections/${inspection.id}/send-report`).send({}).expect(403);
    const bad = await admin.post(`/api/inspections/${inspection.id}/send-report`).send({ to: 'electrician@ampwright.test' }).expect(400);
    assert.ok(bad.body.error.fields.to);

    const inspector = await ctx.signIn('inspector');
    const res = await inspector.post(`/api/inspections/${inspection.id}/send-report`).send({}).expect(200);
    assert.deepEqual(res.body.sentTo, ['owner@ampwright.test']);
    const mail = await mailTo('owner@ampwright.test');
    assert.match(mail.subject, /Inspection report/);
    const pdf = (mail.attachments ?? []).find((a) => a.contentType === 'application/pdf');
    assert.ok(pdf, 'a PDF attached');
    const name = pdf.generatedFileName ?? pdf.fileName ?? '';
    const bytes = Buffer.from(await (await fetch(`${INBOX}/email/${mail.id}/attachment/${encodeURIComponent(name)}`)).arrayBuffer());
    assert.equal(bytes.subarray(0, 5).toString(), '%PDF-', 'the attachment is a PDF');
  });
});
