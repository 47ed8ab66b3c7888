import type { TakeHomeReport } from '@stavemark/shared';
import type { MailKind } from './entities/outbound-mail.entity.js';

/** Facts a template needs. Only names and plain facts: the link is added at send time. */
export interface InvitationData {
  organisationName: string;
  displayName: string;
}
export interface GuardianNoticeData {
  organisationName: string;
  guardianName: string;
  children: string[];
}
export interface PasswordResetData {
  displayName: string;
}
/** The take-home report after results are released (issue 7 §5): plain words, no raw figures. */
export interface ResultsReportData {
  organisationName: string;
  recipientName: string;
  /** Sent to a guardian about their child, or to the student. */
  forGuardian: boolean;
  report: TakeHomeReport;
}
/** A flagged pair handed to a third examiner (design.md §4.5). */
export interface ThirdMarkingData {
  displayName: string;
  sittingTitle: string;
  sittingDate: string;
  candidate: string;
  note: string | null;
}
/**
 * A sitting's invitation, change or cancellation (sittings/sitting-invitations.ts words it when the
 * change is made, so the message says what the recipient was told then), with its calendar file.
 */
export interface SittingMailData {
  subject: string;
  text: string;
  /** The RFC 5545 calendar file, attached. */
  ics: string;
  icsFilename: string;
}
export type MailData =
  | InvitationData
  | GuardianNoticeData
  | PasswordResetData
  | ResultsReportData
  | ThirdMarkingData
  | SittingMailData;

export interface MailAttachment {
  filename: string;
  content: string;
  contentType: string;
}

export interface RenderedMail {
  subject: string;
  text: string;
  html: string;
  attachments?: MailAttachment[];
}

export interface LinkFacts {
  url: string;
  /** Where to ask for a fresh link when this one has run out. */
  forgotUrl: string;
  /** "72 hours", "14 days". */
  lifetime: string;
}

const escapeHtml = (s: string): string =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string,
  );

/** "Ada", "Ada and Bram", "Ada, Bram and Cleo". */
export function listNames(names: string[]): string {
  if (names.length <= 1) return names[0] ?? '';
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** One message as paragraphs; a paragraph that is exactly the link becomes a button in HTML. */
function compose(
  subject: string,
  paragraphs: (string | { link: LinkFacts; label: string })[],
): RenderedMail {
  const text =
    paragraphs.map((p) => (typeof p === 'string' ? p : `${p.label}:\n${p.link.url}`)).join('\n\n') +
    '\n';
  const body = paragraphs
    .map((p) =>
      typeof p === 'string'
        ? `<p style="margin:0 0 16px">${escapeHtml(p).replace(/\n/g, '<br>')}</p>`
        : `<p style="margin:0 0 16px"><a href="${escapeHtml(p.link.url)}" style="display:inline-block;padding:10px 18px;background:#1d4f91;color:#ffffff;text-decoration:none;border-radius:4px">${escapeHtml(p.label)}</a></p>` +
          `<p style="margin:0 0 16px;font-size:13px;color:#4a4f57;word-break:break-all">If the button does not work, copy this address into your browser:<br>${escapeHtml(p.link.url)}</p>`,
    )
    .join('\n');
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(subject)}</title></head>
<body style="margin:0;padding:24px;background:#f7f5f0;font-family:'Public Sans',Arial,sans-serif;font-size:16px;line-height:1.5;color:#1f2328">
<div style="max-width:560px;margin:0 auto;background:#ffffff;padding:24px;border-radius:6px">
${body}
</div></body></html>
`;
  return { subject, text, html };
}

export function renderMail(kind: MailKind, data: MailData, link: LinkFacts | null): RenderedMail {
  // Results and third-marking notices carry no one-time link: the reader signs in as usual.
  if (kind === 'results_report') return renderResultsReport(data as ResultsReportData);
  if (kind === 'third_marking') return renderThirdMarking(data as ThirdMarkingData);
  if (kind === 'sitting_invitation' || kind === 'sitting_change' || kind === 'sitting_cancellation')
    return renderSittingMail(data as SittingMailData);
  if (!link) throw new Error(`A ${kind} e-mail needs its link`);
  switch (kind) {
    case 'invitation': {
      const d = data as InvitationData;
      return compose(`Welcome to Stavemark at ${d.organisationName}`, [
        `Hello ${d.displayName},`,
        `${d.organisationName} has made you a Stavemark account. It is where you will find your mock-exam results, your teacher's comments and how your technique is coming along over the year.`,
        `To begin, choose a password of your own (at least 12 characters):`,
        { link, label: 'Choose my password' },
        `The link works once, for ${link.lifetime}. If it has run out, ask for a fresh one here: ${link.forgotUrl}`,
        `If you were not expecting this, you can simply ignore it: nothing happens until the link is used.`,
        `With best wishes,\n${d.organisationName}`,
      ]);
    }
    case 'guardian_notice': {
      const d = data as GuardianNoticeData;
      const names = listNames(d.children);
      const plural = d.children.length > 1;
      return compose(`${names} at ${d.organisationName}: what we keep, and two questions for you`, [
        `Hello ${d.guardianName},`,
        `${d.organisationName} uses Stavemark to help pupils prepare for graded practical exams in piano. ${names} ${plural ? 'now have places' : 'now has a place'} in it, with you as ${plural ? 'their' : 'the'} contact.`,
        `What we keep: ${plural ? 'each child’s' : 'your child’s'} name, date of birth, pupil number, grade and class, and through the year the marks and short comments from mock exams and how their technique develops. Only their teachers, the examiners while marking, and you can see it.`,
        `We would like to ask you two things:\n• May we send their results to you by e-mail?\n• May we make audio or video recordings of them playing, for marking and for practice? Recordings are kept for a limited time and then deleted.`,
        { link, label: 'Give my answers' },
        `The link works once, for ${link.lifetime}. Until we hear from you, we will not e-mail results or make recordings. You can change your mind at any time by writing to the school.`,
        `Thank you, and warm wishes,\n${d.organisationName}`,
      ]);
    }
    case 'password_reset': {
      const d = data as PasswordResetData;
      return compose('Choose a new Stavemark password', [
        `Hello ${d.displayName},`,
        `Someone, we hope you, asked to reset the Stavemark password for this address. You can choose a new one here:`,
        { link, label: 'Choose a new password' },
        `The link works once, for ${link.lifetime}. Choosing a new password signs you out everywhere else.`,
        `If you did not ask for this, you can ignore this e-mail: your password stays as it is.`,
        `With best wishes,\nStavemark`,
      ]);
    }
  }
}

function renderResultsReport(d: ResultsReportData): RenderedMail {
  const r = d.report;
  const first = r.studentName.split(' ')[0] ?? r.studentName;
  const bullets = (items: string[]) => items.map((i) => `• ${i}`).join('\n');
  const paragraphs: string[] = [
    `Hello ${d.recipientName},`,
    d.forGuardian
      ? `${first}'s results from the ${r.sittingTitle} (${r.date}) are ready. Here is a short report in plain words.`
      : `Your results from the ${r.sittingTitle} (${r.date}) are ready. Here is a short report in plain words.`,
    r.summary,
    `What went well:\n${bullets(r.strengths)}`,
    `What to work on next:\n${bullets(r.nextSteps)}`,
  ];
  if (r.teacherNote) paragraphs.push(`A note from ${d.forGuardian ? `${first}'s` : 'your'} teacher:\n${r.teacherNote}`);
  if (r.caution) paragraphs.push(r.caution);
  paragraphs.push(
    d.forGuardian
      ? `If you have questions, ${first}'s teacher will be glad to talk them through.`
      : `You can read this report, with your marks and the examiners' comments, in Stavemark under My results.`,
    `With best wishes,\n${d.organisationName}`,
  );
  return compose(`${d.forGuardian ? `${first}'s` : 'Your'} mock-exam report: ${r.sittingTitle}`, paragraphs);
}

function renderSittingMail(d: SittingMailData): RenderedMail {
  const mail = compose(d.subject, d.text.trimEnd().split(/\n{2,}/));
  return {
    ...mail,
    // The text as worded, not re-joined: it is what the recipient was told.
    text: d.text,
    attachments: [
      { filename: d.icsFilename, content: d.ics, contentType: 'text/calendar; charset=utf-8; method=PUBLISH' },
    ],
  };
}

function renderThirdMarking(d: ThirdMarkingData): RenderedMail {
  const paragraphs = [
    `Hello ${d.displayName},`,
    `You are asked to third-mark ${d.candidate} from the ${d.sittingTitle} (${d.sittingDate}): the two examiners' marks are further apart than the moderation tolerance allows.`,
    `The slot is listed on your Marking page. Mark it as you would any other: you will not see the other examiners' marks until you have submitted yours.`,
  ];
  if (d.note) paragraphs.push(`A note from the moderator:\n${d.note}`);
  paragraphs.push(`With thanks,\nStavemark`);
  return compose(`Third marking: ${d.candidate}, ${d.sittingTitle}`, paragraphs);
}

export function lifetimeWords(ms: number): string {
  const hours = Math.round(ms / 3600_000);
  if (hours % 24 === 0 && hours > 72) return `${hours / 24} days`;
  return hours === 1 ? '1 hour' : `${hours} hours`;
}
