import type { Role } from '@shared/permissions';
import { ROLE_LABELS } from '@shared/permissions';
import type { OutgoingMail } from './mailer';

export function inviteMail(input: { to: string; teamName: string; invitedBy: string; role: Role; link: string }): OutgoingMail {
  return {
    to: input.to,
    subject: `${input.invitedBy} invited you to ${input.teamName} on Sheetsmith`,
    text: [
      `Hello,`,
      ``,
      `${input.invitedBy} invited you to join the team "${input.teamName}" on Sheetsmith as ${ROLE_LABELS[input.role].toLowerCase()}.`,
      ``,
      `Accept the invitation here (the link works once and expires in 7 days):`,
      input.link,
      ``,
      `If you did not expect this, you can ignore this message.`,
    ].join('\n'),
  };
}

export function passwordResetMail(input: { to: string; name: string; link: string }): OutgoingMail {
  return {
    to: input.to,
    subject: 'Choose a new Sheetsmith password',
    text: [
      `Hello ${input.name},`,
      ``,
      `Someone (hopefully you) asked to reset the password of your Sheetsmith account.`,
      `Choose a new password here (the link works once and expires in 1 hour):`,
      input.link,
      ``,
      `If you did not ask for this, ignore this message: your password stays as it is.`,
    ].join('\n'),
  };
}
