import { Router, type Response } from 'express';
import { getMail, listMail } from '../mail/mailbox';
import { escapeHtml, formatUtc } from '../mail/templates';
import type { CapturedMail } from '../mail/types';

// A development tool: plain server-rendered HTML, no JavaScript (the CSP forbids inline
// scripts, and there is nothing here that needs any).

const TITLE = 'Captured mail (development)';

const STYLE = `
body { margin: 0; background: #F7F5F0; color: #0F1A24; font: 16px/1.5 system-ui, sans-serif; }
main { max-width: 900px; margin: 0 auto; padding: 24px 16px; }
h1 { font-size: 24px; margin: 0 0 4px; }
.hint { color: #44505B; margin: 0 0 16px; }
table { width: 100%; border-collapse: collapse; background: #FFFFFF; }
th, td { text-align: left; padding: 8px 12px; border-bottom: 1px solid #C9C4B8; vertical-align: top; }
th { font-size: 14px; color: #44505B; }
td.time { white-space: nowrap; }
a { color: #0B5563; }
dl { display: grid; grid-template-columns: max-content 1fr; gap: 4px 16px; margin: 0 0 16px; }
dt { color: #44505B; }
dd { margin: 0; overflow-wrap: anywhere; }
pre { white-space: pre-wrap; overflow-wrap: anywhere; background: #FFFFFF; border: 1px solid #C9C4B8;
  border-radius: 6px; padding: 16px; font: 15px/1.5 ui-monospace, monospace; }
`;

function page(heading: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(heading === TITLE ? TITLE : `${heading} · ${TITLE}`)}</title>
<style>${STYLE}</style>
</head>
<body>
<main>
${body}
</main>
</body>
</html>
`;
}

function sendPage(res: Response, status: number, html: string): void {
  // Captured mail holds sign-in links: never keep a copy in a cache.
  res.status(status).set('Cache-Control', 'no-store').type('html').send(html);
}

function when(mail: CapturedMail): string {
  const date = new Date(mail.receivedAt);
  return Number.isNaN(date.getTime()) ? mail.receivedAt : formatUtc(date, true);
}

// Trailing punctuation usually ends the sentence around a URL rather than the URL itself.
const URL_PATTERN = /https?:\/\/[^\s<>"']+[^\s<>"'.,;:!?)\]]/g;

/** Escapes the text and turns each http(s) URL into a link. */
export function linkify(text: string): string {
  let html = '';
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const url = match[0];
    const start = match.index;
    html += escapeHtml(text.slice(last, start));
    html += `<a href="${escapeHtml(url)}">${escapeHtml(url)}</a>`;
    last = start + url.length;
  }
  return html + escapeHtml(text.slice(last));
}

function listPage(messages: CapturedMail[], mailboxDir: string): string {
  const rows = messages
    .map(
      (m) => `<tr>
<td class="time">${escapeHtml(when(m))}</td>
<td>${escapeHtml(m.to.join(', '))}</td>
<td><a href="/dev/mail/${encodeURIComponent(m.id)}">${escapeHtml(m.subject || '(no subject)')}</a></td>
</tr>`,
    )
    .join('\n');
  const content =
    messages.length === 0
      ? '<p>No mail yet. Whatever the app sends while you develop shows up here.</p>'
      : `<table>
<thead><tr><th scope="col">Received</th><th scope="col">To</th><th scope="col">Subject</th></tr></thead>
<tbody>
${rows}
</tbody>
</table>`;
  return page(
    TITLE,
    `<h1>${TITLE}</h1>
<p class="hint">Nothing here left this computer. Newest first; reload the page to see new mail. Folder: ${escapeHtml(mailboxDir)}</p>
${content}`,
  );
}

function messagePage(m: CapturedMail): string {
  const subject = m.subject || '(no subject)';
  return page(
    subject,
    `<p><a href="/dev/mail">← All captured mail</a></p>
<h1>${escapeHtml(subject)}</h1>
<dl>
<dt>From</dt><dd>${escapeHtml(m.from)}</dd>
<dt>To</dt><dd>${escapeHtml(m.to.join(', '))}</dd>
<dt>Received</dt><dd>${escapeHtml(when(m))}</dd>
</dl>
<pre>${linkify(m.text)}</pre>`,
  );
}

function notFoundPage(): string {
  return page(
    'Message not found',
    `<p><a href="/dev/mail">← All captured mail</a></p>
<h1>Message not found</h1>
<p>There is no captured message with that id. It may have been cleared.</p>`,
  );
}

/** Mount outside production only: it shows every message the app has sent, links included. */
export function devMailRouter(mailboxDir: string): Router {
  const router = Router();
  router.get('/dev/mail', async (_req, res) => {
    sendPage(res, 200, listPage(await listMail(mailboxDir), mailboxDir));
  });
  router.get('/dev/mail/:id', async (req, res) => {
    const mail = await getMail(mailboxDir, req.params.id);
    if (mail) sendPage(res, 200, messagePage(mail));
    else sendPage(res, 404, notFoundPage());
  });
  router.get('/api/dev/mail', async (_req, res) => {
    const messages = await listMail(mailboxDir);
    res.set('Cache-Control', 'no-store').json({ messages });
  });
  return router;
}
