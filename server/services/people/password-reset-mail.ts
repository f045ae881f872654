import { renderMail } from '../notifications/mail-layout';

export interface PasswordResetMailInput {
  name: string;
  labName: string;
  link: string;
  expiresInMinutes: number;
  /** True when an administrator asked for it rather than the person. */
  requestedByAdmin: boolean;
}

/** The "choose a new password" message, as text and HTML. */
export function passwordResetMail(input: PasswordResetMailInput): { subject: string; text: string; html: string } {
  const who = input.requestedByAdmin
    ? `An administrator at ${input.labName} asked Paraxia to send you a link to choose a new password.`
    : `Someone (we hope you) asked Paraxia for a link to choose a new password for your account at ${input.labName}.`;
  const rendered = renderMail({
    heading: 'Choose a new password',
    paragraphs: [`Hello ${input.name},`, who, `The link works once and expires in ${input.expiresInMinutes} minutes.`],
    links: [{ label: 'Choose a new password', url: input.link }],
    footnote: 'If you did not expect this message, ignore it: your password stays as it is.',
  });
  return { subject: `Choose a new Paraxia password (${input.labName})`, ...rendered };
}
