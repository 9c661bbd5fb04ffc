/**
 * The payments service's published test card numbers, and what the stand-in does with each:
 * - 4242424242424242: every payment succeeds.
 * - 4000000000000002: declined, at checkout and on renewal.
 * - 4000002500003155: asks for authentication (a confirm step) at checkout; once confirmed, renewals succeed.
 * - 4000000000000341: can be saved (e.g. for a trial) but every charge is declined.
 */
export type CardBehaviour = 'succeeds' | 'declined' | 'authentication_required' | 'attach_then_decline';

const CARDS: Record<string, CardBehaviour> = {
  '4242424242424242': 'succeeds',
  '4000000000000002': 'declined',
  '4000002500003155': 'authentication_required',
  '4000000000000341': 'attach_then_decline',
};

export const normaliseCardNumber = (input: string) => input.replace(/[\s-]/g, '');

export function cardBehaviour(number: string): CardBehaviour | undefined {
  return CARDS[normaliseCardNumber(number)];
}

/** Whether an off-session charge (a renewal) on a saved card goes through. */
export function chargeSucceeds(number: string | null): boolean {
  const behaviour = number ? cardBehaviour(number) : undefined;
  return behaviour === 'succeeds' || behaviour === 'authentication_required';
}
