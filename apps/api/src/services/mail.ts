/**
 * E-mail with nodemailer. Production: SMTP_URL. Development and tests: a local SMTP fake
 * (smtp-server) that the API process starts; it keeps the messages in memory for admins and
 * tests. Never the internet unless SMTP_URL says so.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { SMTPServer } from 'smtp-server';
import { CAUTION } from '@scarpline/core/caution';
import { fsText, JOB_STATE_WORDS, VERDICT_WORDS, VERDICTS } from '@scarpline/core/verdict';
import { config } from '../config';
import { log } from '../log';
import { Batch, SectionRow, User } from '../models';
import { batchCases, progress, stationsBelow, verdictCounts } from './batches';

export interface FakeMessage {
  from: string;
  to: string[];
  raw: string;
  receivedAt: Date;
}

const inbox: FakeMessage[] = [];
let fake: SMTPServer | null = null;
let fakePort = 0;
let transport: Transporter | null = null;

/** Starts the local SMTP fake (idempotent) and returns its port. */
export async function startSmtpFake(port = config.smtpFakePort): Promise<number> {
  if (fake) return fakePort;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        inbox.push({
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map((r) => r.address),
          raw: Buffer.concat(chunks).toString('utf8'),
          receivedAt: new Date(),
        });
        callback();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  fake = server;
  const addr = server.server.address();
  fakePort = typeof addr === 'object' && addr ? addr.port : port;
  return fakePort;
}

export async function stopSmtpFake(): Promise<void> {
  if (!fake) return;
  const s = fake;
  fake = null;
  transport?.close();
  transport = null;
  await new Promise<void>((resolve) => s.close(() => resolve()));
}

export function fakeInbox(): FakeMessage[] {
  return inbox.slice();
}

function mailer(): Transporter | null {
  if (transport) return transport;
  if (config.smtpUrl) transport = nodemailer.createTransport(config.smtpUrl);
  else if (fake)
    transport = nodemailer.createTransport({
      host: '127.0.0.1',
      port: fakePort,
      secure: false,
      ignoreTLS: true,
    });
  return transport;
}

/**
 * Whether mail can go anywhere: SMTP_URL is set, or the local fake runs in this process. False
 * in production without SMTP_URL (the fake is never started there).
 */
export function mailConfigured(): boolean {
  return mailer() !== null;
}

/** Sends one message; false when there is no transport or recipient, or the send failed. */
async function send(to: string[], subject: string, text: string): Promise<boolean> {
  const t = mailer();
  if (!t || to.length === 0) return false;
  try {
    await t.sendMail({
      from: config.mailFrom,
      to,
      subject,
      text: `${text}\n\nCaution: ${CAUTION}\n`,
    });
    return true;
  } catch (e) {
    // Mail is a notice, not part of the result: a failed send is logged, never fatal.
    log.warn({ err: e, to, subject }, `mail: not sent (${(e as Error).message})`);
    return false;
  }
}

async function recipients(batch: Batch): Promise<string[]> {
  const submitter = await User.findByPk(batch.submittedBy);
  const list = [submitter?.email, ...config.mailTo.split(',')].map((s) => s?.trim());
  return [...new Set(list.filter((s): s is string => Boolean(s)))];
}

/** A batch in numbers, in the words of the core's vocabulary: its jobs, then its verdicts. */
async function summary(batchId: number): Promise<string[]> {
  const p = await progress(batchId);
  const v = await verdictCounts(batchId);
  return [
    `Sections: ${p.total}; ${JOB_STATE_WORDS.done}: ${p.done}; ${JOB_STATE_WORDS.failed}: ${p.failed}.`,
    `Verdicts: ${VERDICTS.filter((k) => k !== 'input-error')
      .map((k) => `${VERDICT_WORDS[k]}: ${v[k]}`)
      .join('; ')}.`,
  ];
}

/** A case below its requirement: its name, its governing FS and its required FS. */
export interface CaseBelow {
  name: string;
  fs: number | null;
  requiredFs: number | null;
}

const belowText = (c: CaseBelow) =>
  `${c.name}: FS ${c.fs === null ? '—' : fsText(c.fs)} against required ${c.requiredFs ?? '—'}`;

/** How many lines of stations below their requirement a batch's mail lists at most. */
const MAIL_STATIONS = 200;

/**
 * The stations of a batch below their requirement, by case: a line per case (in the order the
 * batches' cases were first seen) with the stations below in it, in station order, each with
 * its FS against the requirement.
 */
async function belowByCase(batchId: number): Promise<string[]> {
  const rows = await stationsBelow(batchId, MAIL_STATIONS + 1);
  if (rows.length === 0) return [];
  const order = await batchCases(batchId);
  const byCase = new Map<string, string[]>();
  for (const r of rows.slice(0, MAIL_STATIONS)) {
    byCase.set(r.name, [...(byCase.get(r.name) ?? []), belowText({ ...r, name: r.key })]);
  }
  const out = ['', `Stations ${VERDICT_WORDS.below}, by case:`];
  const rank = (name: string) => order.indexOf(name) + 1 || order.length + 1;
  for (const [name, lines] of [...byCase].sort((a, b) => rank(a[0]) - rank(b[0]))) {
    out.push(`- ${name} (${lines.length}):`, ...lines.map((l) => `    ${l}`));
  }
  if (rows.length > MAIL_STATIONS) {
    out.push(
      `(the first ${MAIL_STATIONS} only: the batch's results list them all, ?verdict=below)`,
    );
  }
  return out;
}

export async function batchFinished(batchId: number): Promise<void> {
  const batch = await Batch.findByPk(batchId);
  if (!batch) return;
  const p = await progress(batchId);
  await send(
    await recipients(batch),
    `Scarpline batch ${batch.name} finished: ${p.belowRequiredFs} of ${p.total} ${VERDICT_WORDS.below}`,
    [
      `Batch ${batch.id} (${batch.name}) has finished.`,
      ...(await summary(batchId)),
      ...(await belowByCase(batchId)),
    ].join('\n'),
  );
}

/** Tells that a station is below its requirement, with each case it is below in. */
export async function sectionBelowFs(section: SectionRow, cases: CaseBelow[]): Promise<void> {
  const batch = await Batch.findByPk(section.batchId);
  if (!batch) return;
  await send(
    await recipients(batch),
    `Scarpline: section ${section.key} is ${VERDICT_WORDS.below}`,
    [
      `Section ${section.key} (batch ${batch.name}): ${VERDICT_WORDS.below} in ${cases.length === 1 ? 'one case' : `${cases.length} cases`}:`,
      ...cases.map((c) => `- ${belowText(c)}`),
    ].join('\n'),
  );
}

/** Asks reviewers to look at a finished batch; true when the message was handed to SMTP. */
export async function reviewRequested(
  batch: Batch,
  requester: { name: string; email: string },
  to: string[],
  comment: string,
): Promise<boolean> {
  return send(
    to,
    `Scarpline: review requested for batch ${batch.name}`,
    [
      `${requester.name} <${requester.email}> asks for a review of batch ${batch.id} (${batch.name}).`,
      ...(await summary(batch.id)),
      ...(comment ? ['', comment] : []),
      '',
      `Results: /api/v1/batches/${batch.id}/sections; sign off: POST /api/v1/batches/${batch.id}/reviews.`,
    ].join('\n'),
  );
}

/**
 * Invites a new user: the address to open, the e-mail address to sign in with and the password
 * generated for them. True when the message was handed to SMTP.
 */
export async function invitation(
  user: { email: string; name: string; role: string },
  password: string,
  invitedBy: { name: string; email: string } | null,
): Promise<boolean> {
  const by = invitedBy ? `${invitedBy.name} <${invitedBy.email}>` : 'An administrator';
  return send(
    [user.email],
    'Your Scarpline account',
    [
      `Hello ${user.name},`,
      '',
      `${by} has given you a Scarpline account with the role ${user.role}.`,
      '',
      `Sign in at: ${config.publicUrl}`,
      `E-mail address: ${user.email}`,
      `Password: ${password}`,
      '',
      'The password was generated for you and is sent only in this message; Scarpline keeps',
      'nothing but a hash of it. If this message reached anyone else, tell your administrator:',
      'they can disable the account at once.',
    ].join('\n'),
  );
}

/** A link to set a new password, for someone who asked for it. True when handed to SMTP. */
export async function passwordResetLink(
  user: { email: string; name: string },
  link: string,
  minutes: number,
): Promise<boolean> {
  return send(
    [user.email],
    'Set a new Scarpline password',
    [
      `Hello ${user.name},`,
      '',
      'Someone (we hope you) asked to set a new password for your Scarpline account.',
      `Open this link within ${minutes} minutes to choose one; it works once:`,
      '',
      link,
      '',
      'If you did not ask for this, ignore this message: your password stays as it is.',
    ].join('\n'),
  );
}

/**
 * Tells the administrators (active admin users and MAIL_TO) that a batch has stalled: its
 * sections wait and no worker is alive. Sent once per stall (services/workers.ts).
 */
export async function batchStalled(batchId: number, why: string): Promise<boolean> {
  const batch = await Batch.findByPk(batchId);
  if (!batch) return false;
  const admins = await User.findAll({ where: { role: 'admin', active: true } });
  const to = [...new Set([...admins.map((u) => u.email), ...config.mailTo.split(',')])]
    .map((s) => s.trim())
    .filter(Boolean);
  const p = await progress(batchId);
  return send(
    to,
    `Scarpline: batch ${batch.name} has stalled (no worker is running)`,
    [
      `Batch ${batch.id} (${batch.name}) has ${p.queued + p.running} of ${p.total} sections waiting.`,
      why,
      '',
      'Start a worker (npm run worker, or the service that runs the workers), and look at the',
      "workers' logs for why they ended. GET /ready answers 503 while no worker is alive.",
    ].join('\n'),
  );
}
