import { listCaughtMail, waitForCaughtMail, type CaughtMail } from '../src/mail-catcher/mailbox';
import { api, tokenFor } from './e2e-support/api';

// The test script runs a mail catcher for the server under test and tells us where it stores mail.
const MAIL_DIR = process.env.MAIL_CATCHER_DIR;
const HEADER =
  'Pupil number,Given name,Family name,Student e-mail,Date of birth,Guardian name,Guardian e-mail,Grade,Class code';
const run = Date.now().toString(36);
const linkIn = (mail: CaughtMail): { url: string; token: string } => {
  const m = /(http\S+#token=([A-Za-z0-9_-]{43}))/.exec(mail.text);
  if (!m) throw new Error(`no link in "${mail.subject}"`);
  return { url: m[1]!, token: m[2]! };
};

describe('class-list import over HTTP, with the e-mails it causes', () => {
  let teacher: string;
  beforeAll(async () => {
    if (!MAIL_DIR)
      throw new Error('MAIL_CATCHER_DIR is not set: run this through `npm test -- e2e`');
    teacher = await tokenFor('teacher@demo.example');
  });
  const upload = (csv: string, dryRun: boolean) =>
    api()
      .post(`/api/classes/import${dryRun ? '?dryRun=true' : ''}`)
      .set('Authorization', `Bearer ${teacher}`)
      .attach('file', Buffer.from(csv), { filename: 'e2e.csv', contentType: 'text/csv' });

  it('a failed import changes nothing and sends no mail', async () => {
    const student = `fail.${run}@pupils.example`;
    const csv = [
      HEADER,
      `E2F-${run},Nia,Fallow,${student},2000-01-01,,,5,E2E-F-${run}`,
      `E2F2-${run},Tom,Fallow,,2015-01-01,,,1,E2E-F-${run}`,
    ].join('\r\n');
    const res = await upload(csv, false);
    expect(res.status).toBe(400);
    expect(res.body.details.report.rows[1]).toMatchObject({ line: 3, status: 'error' });
    expect(res.body.details.report.rows[1].errors[0]).toMatch(/needs a guardian e-mail/);
    // Nothing was written: the class does not exist and a dry run still calls the first row new.
    const classes = await api().get('/api/classes').set('Authorization', `Bearer ${teacher}`);
    expect(classes.body.map((c: { code: string }) => c.code)).not.toContain(`E2E-F-${run}`);
    await new Promise((r) => setTimeout(r, 3000));
    const caught = await listCaughtMail(MAIL_DIR!);
    expect(caught.filter((m) => m.envelope.to.includes(student))).toEqual([]);
  });

  it('import → the catcher receives the invitation → follow the link → set a password → sign in', async () => {
    const email = `ok.${run}@pupils.example`;
    const guardian = `guardian.${run}@family.example`;
    const csv = [
      HEADER,
      `E2A-${run},Lark,Ember,${email},2001-04-02,,,6,E2E-${run}`,
      `E2B-${run},Moss,Ember,,2016-05-03,Ash Ember,${guardian},1,E2E-${run}`,
      `E2C-${run},Fern,Ember,,2018-06-04,Ash Ember,${guardian},0,E2E-${run}`,
    ].join('\n');
    const preview = await upload(csv, true);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({
      counts: { new: 3, updated: 0, unchanged: 0, error: 0 },
      invitations: 1,
      guardianNotices: 1,
    });

    const applied = await upload(csv, false);
    expect(applied.status).toBe(200);
    expect(applied.body).toMatchObject({ applied: true, counts: { new: 3 } });

    const invite = await waitForCaughtMail(MAIL_DIR!, (m) => m.envelope.to.includes(email), {
      timeoutMs: 15_000,
    });
    expect(invite.subject).toBe('Welcome to Stavemark at Kestrel Lane Music School');
    expect(invite.html).toContain('Choose my password');
    const notice = await waitForCaughtMail(MAIL_DIR!, (m) => m.envelope.to.includes(guardian), {
      timeoutMs: 15_000,
    });
    expect(notice.subject).toMatch(/^Moss and Fern at Kestrel Lane Music School/);

    // The link points at this server's page, which sends the token to the API.
    const { url, token } = linkIn(invite);
    expect(
      url.startsWith(`${process.env.API_URL ?? 'http://127.0.0.1:3100'}/account/welcome#token=`),
    ).toBe(true);
    const info = await api().post('/api/account/link').send({ token });
    expect(info.body).toMatchObject({ purpose: 'invitation', displayName: 'Lark Ember' });
    const set = await api()
      .post('/api/account/accept-invitation')
      .send({ token, password: 'e2e-chosen-password' });
    expect(set.status).toBe(200);
    const login = await api()
      .post('/api/auth/login')
      .send({ email, password: 'e2e-chosen-password' });
    expect(login.status).toBe(200);
    expect(login.body.user.memberships[0].roles).toEqual(['student']);
    // The link is spent.
    expect(
      (
        await api()
          .post('/api/account/accept-invitation')
          .send({ token, password: 'another-password-1' })
      ).status,
    ).toBe(400);
  });
});
