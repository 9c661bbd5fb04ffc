import { Router } from 'express';
import { z } from 'zod';
import { mailSettingsSchema } from '../../shared/schemas/forecast.schema.ts';
import { timeZoneSchema } from '../../shared/schemas/common.schema.ts';
import { requireSignedIn } from '../auth/authorize.ts';
import type { Db } from '../db/connect.ts';
import { validate } from '../http/validate.ts';
import { mailSettingsOf, saveMailSettings, unsubscribe } from './mail-settings.repository.ts';

/** /api/me/mail-settings (signed in) and the one-click unsubscribe link from every mail. */
export function mailSettingsRoutes(db: Db): Router {
  const router = Router();
  router.get('/me/mail-settings', requireSignedIn, async (req, res) => {
    const { unsubscribeToken: _token, ...settings } = await mailSettingsOf(db, req.user!.id);
    res.json(settings);
  });
  router.put('/me/mail-settings', requireSignedIn, validate({ body: mailSettingsSchema.extend({ timeZone: timeZoneSchema }) }), async (req, res) => {
    await saveMailSettings(db, req.user!.id, req.body);
    res.json(req.body);
  });
  router.get('/mail/unsubscribe/:token', validate({ params: z.object({ token: z.string().max(100) }) }), async (req, res) => {
    const known = await unsubscribe(db, String(req.params.token));
    res
      .status(known ? 200 : 404)
      .type('html')
      .send(
        `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Planktide mail</title></head><body style="font-family:'Nunito Sans',system-ui,sans-serif;max-width:36rem;margin:3rem auto">` +
          (known
            ? '<h1>You will get no more Planktide e-mail</h1><p>Digests and alerts are off. Turn them back on in your account settings.</p>'
            : '<h1>This link is not valid</h1><p>Change your mail in your account settings.</p>') +
          '</body></html>',
      );
  });
  return router;
}
