import request from 'supertest';
import { linkIn } from '../../server/mail/mail-sink.js';
import { addMember, GOOD_PASSWORD, makeAccount, makeWorkshop, uniqueEmail } from '../support/accounts.js';
import { testServer, type TestServer } from '../support/test-app.js';

function invitationToken(url: string): string {
  return url.split('/invitations/')[1]!;
}

describe('workshops', () => {
  let server: TestServer;

  beforeAll(async () => {
    server = await testServer();
  });

  it('should give a new account a personal workshop it owns, and let it create and rename others', async () => {
    const owner = await makeAccount(server.ctx, 'Rae');
    const created = await request(server.app)
      .post('/api/workshops')
      .set('Cookie', owner.cookie)
      .send({ name: 'Tuesday club' });
    expect(created.status).toBe(201);
    expect(created.body).toEqual(jasmine.objectContaining({ name: 'Tuesday club', role: 'owner', personal: false }));

    const renamed = await request(server.app)
      .patch(`/api/workshops/${created.body.id}`)
      .set('Cookie', owner.cookie)
      .send({ name: '  Thursday club  ' });
    expect(renamed.body.name).toBe('Thursday club');
  });

  it('should refuse an empty workshop name with the shared message', async () => {
    const owner = await makeAccount(server.ctx, 'Sol');

    const response = await request(server.app).post('/api/workshops').set('Cookie', owner.cookie).send({ name: ' ' });

    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({ name: 'Workshop name is required' });
  });

  describe('members', () => {
    it('should show addresses to owners only', async () => {
      const owner = await makeAccount(server.ctx, 'Tam');
      const viewer = await makeAccount(server.ctx, 'Uma');
      const workshop = await makeWorkshop(server.ctx, owner);
      await addMember(server.ctx, workshop.id, viewer, 'viewer');

      const asOwner = await request(server.app)
        .get(`/api/workshops/${workshop.id}/members`)
        .set('Cookie', owner.cookie);
      const asViewer = await request(server.app)
        .get(`/api/workshops/${workshop.id}/members`)
        .set('Cookie', viewer.cookie);

      expect(asOwner.body.map((m: { email?: string }) => m.email)).toEqual([owner.email, viewer.email]);
      expect(asViewer.body.map((m: { email?: string }) => m.email)).toEqual([undefined, undefined]);
    });

    it('should always keep one owner: the last owner can neither step down nor leave', async () => {
      const owner = await makeAccount(server.ctx, 'Vic');
      const builder = await makeAccount(server.ctx, 'Wes');
      const workshop = await makeWorkshop(server.ctx, owner);
      await addMember(server.ctx, workshop.id, builder, 'builder');
      const members = `/api/workshops/${workshop.id}/members`;

      const stepDown = await request(server.app)
        .patch(`${members}/${owner.id}`)
        .set('Cookie', owner.cookie)
        .send({ role: 'viewer' });
      const leave = await request(server.app).delete(`${members}/${owner.id}`).set('Cookie', owner.cookie);
      expect(stepDown.status).toBe(409);
      expect(leave.status).toBe(409);
      expect(leave.body.error.code).toBe('last_owner');

      await request(server.app)
        .patch(`${members}/${builder.id}`)
        .set('Cookie', owner.cookie)
        .send({ role: 'owner' })
        .expect(200);
      await request(server.app).delete(`${members}/${owner.id}`).set('Cookie', owner.cookie).expect(204);
      const left = await request(server.app).get(members).set('Cookie', builder.cookie);
      expect(left.body.map((m: { userId: string }) => m.userId)).toEqual([builder.id]);
    });

    it('should let two owners not both step down at once', async () => {
      const first = await makeAccount(server.ctx, 'Xan');
      const second = await makeAccount(server.ctx, 'Yul');
      const workshop = await makeWorkshop(server.ctx, first);
      await addMember(server.ctx, workshop.id, second, 'owner');
      const members = `/api/workshops/${workshop.id}/members`;

      const answers = await Promise.all([
        request(server.app).patch(`${members}/${first.id}`).set('Cookie', first.cookie).send({ role: 'builder' }),
        request(server.app).patch(`${members}/${second.id}`).set('Cookie', second.cookie).send({ role: 'builder' }),
      ]);

      expect(answers.map((answer) => answer.status).sort()).toEqual([200, 409]);
    });

    it('should let any member leave', async () => {
      const owner = await makeAccount(server.ctx, 'Zoe');
      const viewer = await makeAccount(server.ctx, 'Abe');
      const workshop = await makeWorkshop(server.ctx, owner);
      await addMember(server.ctx, workshop.id, viewer, 'viewer');

      await request(server.app)
        .delete(`/api/workshops/${workshop.id}/members/${viewer.id}`)
        .set('Cookie', viewer.cookie)
        .expect(204);

      await request(server.app).get(`/api/workshops/${workshop.id}/members`).set('Cookie', viewer.cookie).expect(404);
    });
  });

  describe('invitations', () => {
    it('should e-mail a single-use link that an existing account accepts', async () => {
      const owner = await makeAccount(server.ctx, 'Bea');
      const guest = await makeAccount(server.ctx, 'Cal');
      const workshop = await makeWorkshop(server.ctx, owner, 'Riverbend course');
      const sent = await request(server.app)
        .post(`/api/workshops/${workshop.id}/invitations`)
        .set('Cookie', owner.cookie)
        .send({ email: guest.email.toUpperCase(), role: 'builder' });
      expect(sent.status).toBe(201);
      const message = await server.mail.waitFor(guest.email);
      expect(message.subject).toBe('Bea invites you to Riverbend course on Benchtide');
      const token = invitationToken(linkIn(message));

      const preview = await request(server.app).get(`/api/invitations/${token}`);
      expect(preview.body).toEqual(
        jasmine.objectContaining({ workshopName: 'Riverbend course', role: 'builder', invitedBy: 'Bea' }),
      );
      const accepted = await request(server.app).post(`/api/invitations/${token}/accept`).set('Cookie', guest.cookie);
      expect(accepted.status).toBe(200);
      expect(accepted.body).toEqual(jasmine.objectContaining({ id: workshop.id, role: 'builder' }));

      await request(server.app).post(`/api/invitations/${token}/accept`).set('Cookie', guest.cookie).expect(404);
    });

    it('should let someone new sign up from the invitation, confirmed by it, and join', async () => {
      const owner = await makeAccount(server.ctx, 'Dot');
      const workshop = await makeWorkshop(server.ctx, owner, 'Harbour diorama');
      const email = uniqueEmail('Eve');
      await request(server.app)
        .post(`/api/workshops/${workshop.id}/invitations`)
        .set('Cookie', owner.cookie)
        .send({ email, role: 'viewer' });
      const token = invitationToken(linkIn(await server.mail.waitFor(email)));

      const signUp = await request(server.app)
        .post('/api/auth/sign-up')
        .send({ email, displayName: 'Eve', password: GOOD_PASSWORD, invitationToken: token });
      expect(signUp.status).toBe(202);
      expect(signUp.body.next).toBe('sign-in');
      const signIn = await request(server.app).post('/api/auth/sign-in').send({ email, password: GOOD_PASSWORD });

      expect(signIn.status).toBe(200);
      expect(signIn.body.workshops).toContain(jasmine.objectContaining({ id: workshop.id, role: 'viewer' }));
    });

    it('should refuse an invitation past its 7 days, and one meant for another address', async () => {
      const owner = await makeAccount(server.ctx, 'Fay');
      const other = await makeAccount(server.ctx, 'Gus');
      const workshop = await makeWorkshop(server.ctx, owner);
      const email = uniqueEmail('Hana');
      await request(server.app)
        .post(`/api/workshops/${workshop.id}/invitations`)
        .set('Cookie', owner.cookie)
        .send({ email, role: 'viewer' });
      const token = invitationToken(linkIn(await server.mail.waitFor(email)));

      const wrongPerson = await request(server.app)
        .post(`/api/invitations/${token}/accept`)
        .set('Cookie', other.cookie);
      expect(wrongPerson.status).toBe(403);
      expect(wrongPerson.body.error.code).toBe('invitation_other_email');

      server.clock.advanceMinutes(7 * 24 * 60 + 1);
      const late = await request(server.app).get(`/api/invitations/${token}`);
      expect(late.status).toBe(410);
      expect(late.body.error.code).toBe('invitation_expired');
    });

    it('should list open invitations to owners and let them withdraw one', async () => {
      const owner = await makeAccount(server.ctx, 'Ida');
      const workshop = await makeWorkshop(server.ctx, owner);
      const sent = await request(server.app)
        .post(`/api/workshops/${workshop.id}/invitations`)
        .set('Cookie', owner.cookie)
        .send({ email: uniqueEmail('Jin'), role: 'viewer' });

      const open = await request(server.app)
        .get(`/api/workshops/${workshop.id}/invitations`)
        .set('Cookie', owner.cookie);
      expect(open.body.map((i: { id: string }) => i.id)).toEqual([sent.body.id]);
      await request(server.app)
        .delete(`/api/workshops/${workshop.id}/invitations/${sent.body.id}`)
        .set('Cookie', owner.cookie)
        .expect(204);
      const after = await request(server.app)
        .get(`/api/workshops/${workshop.id}/invitations`)
        .set('Cookie', owner.cookie);
      expect(after.body).toEqual([]);
    });
  });

  describe('deleting an account', () => {
    it('should wait while the account is the only owner of a workshop with others in it', async () => {
      const owner = await makeAccount(server.ctx, 'Kai');
      const builder = await makeAccount(server.ctx, 'Lee');
      const workshop = await makeWorkshop(server.ctx, owner, 'Canal basin');
      await addMember(server.ctx, workshop.id, builder, 'builder');

      const refused = await request(server.app)
        .delete('/api/account')
        .set('Cookie', owner.cookie)
        .send({ password: GOOD_PASSWORD });

      expect(refused.status).toBe(409);
      expect(refused.body.error.message).toContain('"Canal basin"');
    });

    it('should delete the account with the workshops only it belonged to', async () => {
      const loner = await makeAccount(server.ctx, 'May');
      const solo = await makeWorkshop(server.ctx, loner, 'Solo bench');

      await request(server.app)
        .delete('/api/account')
        .set('Cookie', loner.cookie)
        .send({ password: GOOD_PASSWORD })
        .expect(204);

      await request(server.app).get('/api/account').set('Cookie', loner.cookie).expect(401);
      const again = await makeAccount(server.ctx, 'Nia');
      await request(server.app).get(`/api/workshops/${solo.id}/members`).set('Cookie', again.cookie).expect(404);
    });
  });
});
