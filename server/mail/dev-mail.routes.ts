import { Router } from 'express';
import type { SmtpStandIn } from './smtp-standin.ts';

const escape = (text: string) =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

const linkify = (text: string) => escape(text).replace(/(https?:\/\/[^\s<]+)/g, '<a href="$1">$1</a>');

/** Development only: the messages the local SMTP stand-in caught, newest first. */
export function devMailRoutes(standIn: SmtpStandIn): Router {
  const router = Router();
  router.get('/api/dev/mail', (_req, res) => {
    res.json({ messages: standIn.messages().reverse() });
  });
  router.get('/dev/mail', (_req, res) => {
    const items = standIn
      .messages()
      .reverse()
      .map(
        (m) => `<article><h2>${escape(m.subject)}</h2><p class="meta">To ${escape(m.to.join(', '))} · ${escape(m.receivedAt)}</p><pre>${linkify(m.text)}</pre></article>`,
      )
      .join('');
    res.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Caught mail (development)</title>
<style>body{font-family:'Nunito Sans',system-ui,sans-serif;max-width:48rem;margin:2rem auto;color:#1c2b3a;background:#f7fafc}
article{background:#fff;border:1px solid #d8e0e8;border-radius:8px;padding:1rem;margin:1rem 0}.meta{color:#5b6b7b}pre{white-space:pre-wrap}</style></head>
<body><h1>Mail caught by the local SMTP stand-in</h1><p>Development only. Nothing here was delivered.</p>${items || '<p>No messages yet.</p>'}</body></html>`);
  });
  return router;
}
