import type { Role } from '../../shared/schemas/roles';

export type MailContent = { subject: string; text: string; html: string };

const HTML_ESCAPES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c] ?? c);
}

const MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
];

/**
 * `2 December 2026, 14:05 UTC`: the month spelled out reads the same in every country, and the
 * reader's time zone is unknown to us. Built by hand so the result never depends on ICU data.
 */
export function formatUtc(date: Date, withSeconds = false): string {
  if (Number.isNaN(date.getTime())) throw new Error('Cannot format an invalid date.');
  const two = (n: number) => String(n).padStart(2, '0');
  const time = `${two(date.getUTCHours())}:${two(date.getUTCMinutes())}`;
  const seconds = withSeconds ? `:${two(date.getUTCSeconds())}` : '';
  const month = MONTHS[date.getUTCMonth()] ?? '';
  return `${date.getUTCDate()} ${month} ${date.getUTCFullYear()}, ${time}${seconds} UTC`;
}

/** Names come from people: a line break in one must not start a paragraph of its own. */
function oneLine(value: string): string {
  return value.replace(/\s+/g, ' ').trim();
}

function checkedLink(link: string): string {
  const protocol = URL.canParse(link) ? new URL(link).protocol : '';
  if (protocol !== 'https:' && protocol !== 'http:') {
    throw new Error('A link in an e-mail must be an absolute http(s) URL.');
  }
  return link;
}

// Each message is a list of blocks rendered twice, so the plain text and the HTML version can
// never say different things.
type Block =
  | { kind: 'paragraph'; text: string }
  | { kind: 'button'; label: string; href: string }
  | { kind: 'note'; text: string };

function renderText(blocks: Block[]): string {
  const parts = blocks.map((b) => (b.kind === 'button' ? `${b.label}:\n${b.href}` : b.text));
  return `${parts.join('\n\n')}\n\n— Quenchbook\n`;
}

const colors = { ink: '#0F1A24', paper: '#F7F5F0', muted: '#44505B', primary: '#0B5563' };

function renderHtml(subject: string, blocks: Block[]): string {
  const p = 'margin:0 0 16px;';
  const body = blocks
    .map((b) => {
      if (b.kind === 'paragraph') return `<p style="${p}">${escapeHtml(b.text)}</p>`;
      if (b.kind === 'note') {
        return `<p style="${p}font-size:14px;color:${colors.muted};">${escapeHtml(b.text)}</p>`;
      }
      const href = escapeHtml(b.href);
      return [
        `<p style="margin:24px 0;"><a href="${href}" style="display:inline-block;`,
        `background:${colors.primary};color:#FFFFFF;text-decoration:none;font-weight:bold;`,
        `padding:12px 20px;border-radius:6px;">${escapeHtml(b.label)}</a></p>`,
        `<p style="${p}font-size:14px;color:${colors.muted};">If the button does not work, `,
        `copy this address into your browser:<br>`,
        `<a href="${href}" style="color:${colors.primary};word-break:break-all;">${href}</a></p>`,
      ].join('');
    })
    .join('\n');
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(subject)}</title>
</head>
<body style="margin:0;padding:0;background:${colors.paper};color:${colors.ink};font-family:Arial,Helvetica,sans-serif;font-size:16px;line-height:1.5;">
<div style="max-width:560px;margin:0 auto;padding:24px;">
${body}
<p style="${p}color:${colors.muted};">— Quenchbook</p>
</div>
</body>
</html>
`;
}

function compose(subject: string, blocks: Block[]): MailContent {
  return { subject, text: renderText(blocks), html: renderHtml(subject, blocks) };
}

// Not the app's roleSummaries: those sit in a list where "everything below" makes sense; a mail
// names one role alone, so each sentence has to stand by itself.
export const roleSentences: Record<Role, string> = {
  manager:
    'A manager runs the lab: members, invitations, settings and criteria, and can also do everything technicians and reviewers do.',
  technician:
    'A technician writes recipes, prepares batches, and runs burn tests and submits them for review.',
  reviewer:
    'A reviewer signs off or returns submitted burn tests, and corrects signed ones, giving a reason.',
  viewer: 'A viewer reads everything in the lab and downloads reports, but changes nothing.',
};

export function invitationMail(p: {
  labName: string;
  inviterName: string;
  role: Role;
  link: string;
  expiresAt: Date;
}): MailContent {
  const labName = oneLine(p.labName);
  const inviterName = oneLine(p.inviterName);
  return compose(`${inviterName} invited you to ${labName} in Quenchbook`, [
    { kind: 'paragraph', text: 'Hello,' },
    {
      kind: 'paragraph',
      text: `${inviterName} has invited you to join the lab “${labName}” in Quenchbook as a ${p.role}.`,
    },
    { kind: 'paragraph', text: roleSentences[p.role] },
    { kind: 'button', label: 'Accept the invitation', href: checkedLink(p.link) },
    {
      kind: 'paragraph',
      text: `The link works once and expires on ${formatUtc(p.expiresAt)}.`,
    },
    {
      kind: 'note',
      text: 'If you did not expect this invitation, you can ignore this e-mail: nothing happens unless you open the link.',
    },
  ]);
}

export function passwordResetMail(p: {
  displayName: string;
  link: string;
  expiresInMinutes: number;
}): MailContent {
  const minutes = p.expiresInMinutes === 1 ? '1 minute' : `${p.expiresInMinutes} minutes`;
  return compose('Reset your Quenchbook password', [
    { kind: 'paragraph', text: `Hello ${oneLine(p.displayName)},` },
    {
      kind: 'paragraph',
      text: 'Someone, hopefully you, asked to reset the password of your Quenchbook account.',
    },
    { kind: 'button', label: 'Choose a new password', href: checkedLink(p.link) },
    { kind: 'paragraph', text: `The link works once and expires in ${minutes}.` },
    {
      kind: 'paragraph',
      text: 'When your password changes, every device signed in to your account is signed out, so you will sign in again with the new password.',
    },
    {
      kind: 'note',
      text: 'If you did not ask for this, you can ignore this e-mail: your password stays as it is.',
    },
  ]);
}
