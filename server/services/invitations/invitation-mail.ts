import { renderMail } from '../notifications/mail-layout';

export interface InvitationMailInput {
  name: string;
  labName: string;
  invitedByName: string | null;
  /** Plain words for the roles, e.g. "technician and reviewer". */
  roleWords: string;
  organisationName: string | null;
  link: string;
  expiresAt: Date;
}

function formatUtc(date: Date): string {
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** The invitation message, as text and HTML. */
export function invitationMail(input: InvitationMailInput): { subject: string; text: string; html: string } {
  const inviter = input.invitedByName ? `${input.invitedByName} at ${input.labName}` : input.labName;
  const forWhom = input.organisationName && input.roleWords === 'client' ? ` for ${input.organisationName}` : '';
  const rendered = renderMail({
    heading: 'You are invited to Paraxia',
    paragraphs: [
      `Hello ${input.name},`,
      `${inviter} invited you to Paraxia as ${input.roleWords}${forWhom}. Paraxia is where the lab's focal-length measurements, reviews and certificates live.`,
      'Open the link below to choose your password; your account is created when you do.',
    ],
    facts: [{ label: 'Link expires', value: formatUtc(input.expiresAt) }],
    links: [{ label: 'Accept the invitation', url: input.link }],
    footnote: 'The link works once. If you were not expecting this invitation, ignore this message.',
  });
  return { subject: `Your invitation to Paraxia (${input.labName})`, ...rendered };
}

const ROLE_WORDS: Record<string, string> = { technician: 'technician', reviewer: 'reviewer', client: 'client', admin: 'administrator' };

export function describeRolesInWords(roles: readonly string[]): string {
  const words = roles.map((role) => ROLE_WORDS[role] ?? role);
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}
