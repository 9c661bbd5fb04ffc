import type { Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { slowDown } from 'express-slow-down';

export interface SignInLimits {
  /** How long failed attempts are remembered. */
  windowMs: number;
  /** Failed attempts answered at full speed before the delay starts. */
  freeAttempts: number;
  /** Extra delay for each failed attempt beyond the free ones. */
  delayStepMs: number;
  /** Upper bound of the delay. */
  maxDelayMs: number;
  /** Failed attempts after which the sign-in is refused with 429 until the window passes. */
  maxAttempts: number;
}

export const DEFAULT_SIGN_IN_LIMITS: SignInLimits = {
  windowMs: 15 * 60_000,
  freeAttempts: 3,
  delayStepMs: 500,
  maxDelayMs: 5_000,
  maxAttempts: 20,
};

export interface SignUpLimit {
  windowMs: number;
  /** Sign-up posts allowed per IP address within the window. */
  maxAttempts: number;
}

export const DEFAULT_SIGN_UP_LIMIT: SignUpLimit = { windowMs: 60 * 60_000, maxAttempts: 20 };

function ipOf(req: Request): string {
  return ipKeyGenerator(req.ip ?? req.socket.remoteAddress ?? 'unknown');
}

function emailOf(req: Request): string {
  const body: unknown = req.body;
  const email = body && typeof body === 'object' && 'email' in body ? body.email : undefined;
  return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '';
}

/**
 * Counts failed sign-ins per IP address and e-mail (responses of 400 and above; a successful sign-in
 * redirects and takes its own attempt back off the count). Needs the form body parsed first.
 * Refusal runs first, so a refused attempt is not delayed as well.
 */
export function signInThrottle(limits: SignInLimits, onRefused: (req: Request, res: Response, retryAfterSeconds: number) => void): RequestHandler[] {
  const keyGenerator = (req: Request) => `${ipOf(req)}|${emailOf(req)}`;
  return [
    rateLimit({
      windowMs: limits.windowMs,
      limit: limits.maxAttempts,
      keyGenerator,
      skipSuccessfulRequests: true,
      standardHeaders: false,
      legacyHeaders: false,
      handler: (req, res) => {
        const resetTime = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
        const seconds = resetTime ? Math.max(1, Math.ceil((resetTime.getTime() - Date.now()) / 1000)) : Math.ceil(limits.windowMs / 1000);
        onRefused(req, res, seconds);
      },
    }),
    slowDown({
      windowMs: limits.windowMs,
      delayAfter: limits.freeAttempts,
      delayMs: (used) => (used - limits.freeAttempts) * limits.delayStepMs,
      maxDelayMs: limits.maxDelayMs,
      keyGenerator,
      skipSuccessfulRequests: true,
    }),
  ];
}

export function signUpThrottle(limit: SignUpLimit, onRefused: (req: Request, res: Response, retryAfterSeconds: number) => void): RequestHandler {
  return rateLimit({
    windowMs: limit.windowMs,
    limit: limit.maxAttempts,
    keyGenerator: ipOf,
    standardHeaders: false,
    legacyHeaders: false,
    handler: (req, res) => onRefused(req, res, Math.ceil(limit.windowMs / 1000)),
  });
}
