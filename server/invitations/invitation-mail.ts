import type { OutgoingMail } from '../mail/mailer.ts';

const ROLE_WORDS: Record<string, string> = {
  owner: 'an owner',
  manager: 'a manager',
  biologist: 'a biologist',
  crew: 'crew',
};

export function invitationMail(input: { to: string; organisationName: string; role: string; inviterName: string; link: string; expiresAt: Date }): OutgoingMail {
  const expires = input.expiresAt.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
  const text = [
    `${input.inviterName} has invited you to join ${input.organisationName} on Planktide as ${ROLE_WORDS[input.role] ?? input.role}.`,
    '',
    `Accept the invitation here (the link works once and expires ${expires}):`,
    input.link,
    '',
    'If you did not expect this, ignore this e-mail.',
  ].join('\n');
  return { to: input.to, subject: `Join ${input.organisationName} on Planktide`, text };
}
