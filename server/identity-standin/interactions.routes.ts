import express, { type ErrorRequestHandler, type Request, type Response, type Router } from 'express';
import { errors, type Provider } from 'oidc-provider';
import type { Logger } from 'pino';
import { z } from 'zod';
import { createAccount, emailSchema, findAccountByEmail, newAccountSchema, PASSWORD_MIN, type HostDb } from './accounts.ts';
import type { FormTokens } from './form-tokens.ts';
import { messagePage, pageHeaders, signInPage, signUpPage, type Page } from './pages.ts';
import { verifyAgainstDummy, verifyPassword } from './passwords.ts';
import { signInThrottle, signUpThrottle, type SignInLimits, type SignUpLimit } from './sign-in-limits.ts';

export interface InteractionDeps {
  provider: Provider;
  db: HostDb;
  logger: Logger;
  formTokens: FormTokens;
  signInLimits: SignInLimits;
  signUpLimit: SignUpLimit;
  /** Origins the pages' forms may end up at after redirects (the clients' redirect URIs). */
  formActionSources: readonly string[];
  /** Whether accounts made through the sign-up page get email_verified = true. */
  markSignUpsVerified: boolean;
}

export const SIGN_IN_REFUSED = 'E-mail or password is not right.';
const FIRST_PARTY_SCOPE = 'openid email profile';

/** The interaction cookie names a different interaction than the address: treat it as expired. */
class InteractionMismatch extends Error {}

function field(body: unknown, name: string): string {
  const value = body && typeof body === 'object' ? (body as Record<string, unknown>)[name] : undefined;
  return typeof value === 'string' ? value : '';
}

function minutes(seconds: number): string {
  const m = Math.max(1, Math.ceil(seconds / 60));
  return m === 1 ? '1 minute' : `${m} minutes`;
}

export function interactionRoutes(deps: InteractionDeps): Router {
  const { provider, db, logger, formTokens } = deps;
  const router = express.Router();
  const form = express.urlencoded({ extended: false, limit: '8kb', parameterLimit: 10 });

  const send = (res: Response, page: Page) => {
    res.status(page.status).set(pageHeaders(page, deps.formActionSources)).send(page.html);
  };

  const load = async (req: Request, res: Response) => {
    const interaction = await provider.interactionDetails(req, res);
    if (interaction.uid !== req.params.uid) throw new InteractionMismatch();
    return interaction;
  };

  const refuse = (res: Response, retryAfterSeconds: number, text: string) => {
    res.setHeader('Retry-After', String(retryAfterSeconds));
    send(res, messagePage({ status: 429, title: 'Too many attempts', text }));
  };

  const formExpired = (res: Response) =>
    send(
      res,
      messagePage({
        status: 403,
        title: 'This form has expired',
        text: 'The form was not sent from the current sign-in page. Go back to Planktide and choose Sign in again.',
      }),
    );

  router.get('/interaction/:uid', async (req, res) => {
    const interaction = await load(req, res);
    const uid = interaction.uid;
    switch (interaction.prompt.name) {
      case 'login':
        send(res, signInPage({ uid, formToken: formTokens.issue(uid) }));
        return;
      case 'consent': {
        // Every client of the stand-in is Planktide itself (first party): grant without asking.
        const accountId = interaction.session?.accountId;
        const clientId = interaction.params.client_id;
        if (!accountId || typeof clientId !== 'string') throw new InteractionMismatch();
        const grant = interaction.grantId ? await provider.Grant.find(interaction.grantId) : new provider.Grant({ accountId, clientId });
        if (!grant) throw new InteractionMismatch();
        grant.addOIDCScope(FIRST_PARTY_SCOPE);
        const missingClaims = interaction.prompt.details.missingOIDCClaims;
        if (Array.isArray(missingClaims)) grant.addOIDCClaims(missingClaims.filter((c): c is string => typeof c === 'string'));
        const grantId = await grant.save();
        await provider.interactionFinished(req, res, { consent: interaction.grantId ? {} : { grantId } }, { mergeWithLastSubmission: true });
        return;
      }
      default:
        send(res, messagePage({ status: 400, title: 'Cannot continue', text: 'This sign-in step is not supported by the local stand-in.' }));
    }
  });

  router.get('/interaction/:uid/signup', async (req, res) => {
    const interaction = await load(req, res);
    if (interaction.prompt.name !== 'login') throw new InteractionMismatch();
    send(res, signUpPage({ uid: interaction.uid, formToken: formTokens.issue(interaction.uid), passwordMin: PASSWORD_MIN }));
  });

  router.post(
    '/interaction/:uid/login',
    form,
    ...signInThrottle(deps.signInLimits, (req, res, retryAfter) => {
      logger.warn({ event: 'sign-in refused: too many failures', ip: req.ip }, 'identity stand-in: sign-in refused (429)');
      refuse(res, retryAfter, `Too many failed sign-ins for this e-mail. Wait ${minutes(retryAfter)}, then try again.`);
    }),
    async (req, res) => {
      const interaction = await load(req, res);
      if (interaction.prompt.name !== 'login') throw new InteractionMismatch();
      const uid = interaction.uid;
      if (!formTokens.check(uid, field(req.body, 'formToken'))) {
        formExpired(res);
        return;
      }
      const typedEmail = field(req.body, 'email');
      const password = field(req.body, 'password').slice(0, 1024);
      const email = emailSchema.safeParse(typedEmail);
      const account = email.success ? await findAccountByEmail(db, email.data) : undefined;
      // Unknown e-mail: verify against a dummy hash, so the answer takes as long as for a wrong password.
      const ok = account ? await verifyPassword(password, account.passwordHash) : await verifyAgainstDummy(password);
      if (!account || !ok) {
        logger.info({ event: 'sign-in failed', ip: req.ip }, 'identity stand-in: sign-in failed');
        send(res, signInPage({ uid, formToken: formTokens.issue(uid), email: typedEmail.slice(0, 254), message: SIGN_IN_REFUSED, status: 401 }));
        return;
      }
      logger.info({ event: 'signed in', accountId: account.id }, 'identity stand-in: signed in');
      await provider.interactionFinished(req, res, { login: { accountId: account.id } }, { mergeWithLastSubmission: false });
    },
  );

  router.post(
    '/interaction/:uid/signup',
    form,
    signUpThrottle(deps.signUpLimit, (req, res, retryAfter) => {
      logger.warn({ event: 'sign-up refused: too many attempts', ip: req.ip }, 'identity stand-in: sign-up refused (429)');
      refuse(res, retryAfter, `Too many sign-up attempts from here. Wait ${minutes(retryAfter)}, then try again.`);
    }),
    async (req, res) => {
      const interaction = await load(req, res);
      if (interaction.prompt.name !== 'login') throw new InteractionMismatch();
      const uid = interaction.uid;
      if (!formTokens.check(uid, field(req.body, 'formToken'))) {
        formExpired(res);
        return;
      }
      const values = { email: field(req.body, 'email').slice(0, 254), displayName: field(req.body, 'displayName').slice(0, 200) };
      const parsed = newAccountSchema.safeParse({ ...values, password: field(req.body, 'password') });
      const again = (status: number, extra: Partial<Parameters<typeof signUpPage>[0]>) =>
        send(res, signUpPage({ uid, formToken: formTokens.issue(uid), values, passwordMin: PASSWORD_MIN, status, ...extra }));
      if (!parsed.success) {
        const fieldErrors = z.flattenError(parsed.error).fieldErrors;
        again(400, {
          message: 'Please correct the fields marked below.',
          errors: { email: fieldErrors.email?.[0], password: fieldErrors.password?.[0], displayName: fieldErrors.displayName?.[0] },
        });
        return;
      }
      const account = await createAccount(db, parsed.data, { emailVerified: deps.markSignUpsVerified });
      if (!account) {
        again(409, { message: 'An account cannot be created with this e-mail. If you have one already, sign in instead.' });
        return;
      }
      logger.info({ event: 'account created', accountId: account.id }, 'identity stand-in: account created');
      await provider.interactionFinished(req, res, { login: { accountId: account.id } }, { mergeWithLastSubmission: false });
    },
  );

  const onError: ErrorRequestHandler = (error: unknown, _req, res, next) => {
    if (res.headersSent) {
      next(error);
      return;
    }
    if (error instanceof errors.SessionNotFound || error instanceof InteractionMismatch) {
      send(
        res,
        messagePage({
          status: 400,
          title: 'This sign-in page has expired',
          text: 'Sign-in pages last a limited time and work in the browser that opened them. Go back to Planktide and choose Sign in again.',
        }),
      );
      return;
    }
    const status = typeof (error as { status?: unknown })?.status === 'number' ? (error as { status: number }).status : 500;
    if (status >= 400 && status < 500) {
      send(res, messagePage({ status, title: 'Cannot read this form', text: 'Go back, check the form and send it again.' }));
      return;
    }
    // Only the name and message: never the request body (passwords) or headers (cookies).
    const { name, message } = error instanceof Error ? error : { name: 'Error', message: String(error) };
    logger.error({ err: { name, message } }, 'identity stand-in: interaction failed');
    send(res, messagePage({ status: 500, title: 'Something went wrong', text: 'The sign-in stand-in could not finish this step. Try again.' }));
  };
  router.use(onError);

  return router;
}
