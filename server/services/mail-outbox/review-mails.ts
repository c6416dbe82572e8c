import type { MailMessage } from '@server/mail/mailer.ts';
import { layout } from '@server/mail/templates.ts';

/** Messages about reviews and comments. `to` is filled in by `notify` from the recipient. */
type Draft = Omit<MailMessage, 'to'>;

function message(subject: string, lines: string[], link: { href: string; label: string }): Draft {
  return { subject, text: `${lines.join('\n\n')}\n\n${link.href}\n`, html: layout(lines, link) };
}

export function reviewRequestedMail(p: { piName: string; authorName: string; entryTitle: string; notebookTitle: string; note: string; link: string }): Draft {
  return message(
    `Review requested: ${p.entryTitle}`,
    [
      `Hello ${p.piName},`,
      `${p.authorName} asks you to review "${p.entryTitle}" in ${p.notebookTitle}.`,
      ...(p.note ? [`Their note: ${p.note}`] : []),
    ],
    { href: p.link, label: 'Open the review' },
  );
}

export function reviewDecidedMail(p: {
  authorName: string;
  piName: string;
  entryTitle: string;
  decision: 'approved' | 'changes-requested';
  comment?: string;
  reproduced?: boolean;
  link: string;
}): Draft {
  const approved = p.decision === 'approved';
  return message(
    approved ? `Approved: ${p.entryTitle}` : `Changes requested: ${p.entryTitle}`,
    [
      `Hello ${p.authorName},`,
      approved
        ? `${p.piName} approved and signed "${p.entryTitle}".${p.reproduced === false ? ' The rerun of its cells did not reproduce every stored result; the differences are kept with the signature.' : ''}`
        : `${p.piName} asks for changes to "${p.entryTitle}".`,
      ...(p.comment ? [`${p.piName} wrote: ${p.comment}`] : []),
    ],
    { href: p.link, label: 'Open the entry' },
  );
}

export function commentMail(p: { recipientName: string; authorName: string; entryTitle: string; body: string; reason: 'reply' | 'mention'; link: string }): Draft {
  return message(
    p.reason === 'mention' ? `${p.authorName} mentioned you on ${p.entryTitle}` : `${p.authorName} replied on ${p.entryTitle}`,
    [
      `Hello ${p.recipientName},`,
      p.reason === 'mention' ? `${p.authorName} mentioned you in a comment on "${p.entryTitle}":` : `${p.authorName} replied to your comment on "${p.entryTitle}":`,
      p.body,
    ],
    { href: p.link, label: 'Open the comments' },
  );
}

/** The address of an entry page in the client. */
export const entryLink = (publicUrl: string, notebookId: string, entryId: string) =>
  `${publicUrl.replace(/\/$/, '')}/notebooks/${notebookId}/entries/${entryId}`;
