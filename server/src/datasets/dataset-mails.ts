import type { OutgoingMail } from '../mail/mailer.js';
import { oneLine } from '../mail/mail-text.js';

interface Named {
  title: string;
  version: number;
}

/** The dataset's name for a mail: one line, so a title never shapes the message. */
const named = (d: Named) => `"${oneLine(d.title)}", version ${d.version}`;

const footer = (link: string) => `\n\nOpen it in Traceloom: ${link}\n\n-- \nTraceloom\n`;

/** The mail a reviewer gets when asked to review a dataset. */
export function reviewRequestMail(d: Named, requester: string, link: string): OutgoingMail {
  return {
    subject: `Review requested: ${d.title} (v${d.version})`,
    text: `${requester} asks you to review the dataset ${named(d)}.\nRead its checks, comment on rows, and approve it or ask for changes.${footer(link)}`,
  };
}

/** The mail the dataset's author gets when a reviewer gives a verdict. */
export function verdictMail(
  d: Named,
  reviewer: string,
  verdict: 'approve' | 'changes',
  comment: string,
  link: string,
): OutgoingMail {
  const said = verdict === 'approve' ? 'approved' : 'asked for changes to';
  return {
    subject: `${verdict === 'approve' ? 'Approved' : 'Changes asked'}: ${d.title} (v${d.version})`,
    text: `${reviewer} ${said} the dataset ${named(d)}.${comment ? `\n\nTheir comment:\n${comment}` : ''}${footer(link)}`,
  };
}

/** The mail author and reviewers get when a steward locks a dataset. */
export function lockMail(
  d: Named,
  steward: string,
  hash: string,
  citation: string,
  link: string,
): OutgoingMail {
  return {
    subject: `Locked: ${d.title} (v${d.version})`,
    text: `${steward} locked the dataset ${named(d)}.\nSHA-256: ${hash}\n\nCite it as:\n${citation}${footer(link)}`,
  };
}

/** The invitation a newly invited person gets. */
export function invitationMail(
  name: string,
  role: string,
  inviter: string,
  link: string,
): OutgoingMail {
  return {
    subject: 'You are invited to Traceloom',
    text: `Hello ${name},\n\n${inviter} invited you to Traceloom, the team workbench for partition functions of one-dimensional gases, with the role ${role}.\nChoose your password here (the link works once, for 7 days):\n${link}\nThen sign in with this e-mail address.\n\n-- \nTraceloom\n`,
  };
}
