import type { MailMessage } from './mailer.ts';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

export function layout(paragraphs: string[], link: { href: string; label: string }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  return `<!doctype html><html><body style="font-family: sans-serif; line-height: 1.5; color: #1f2933">
${body}
<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>
<p style="color:#66788a; font-size: 13px">If the link does not open, copy this address into your browser: ${escapeHtml(link.href)}</p>
</body></html>`;
}

export function inviteMail(p: { to: string; name: string; inviterName: string; link: string; expiresHours: number }): MailMessage {
  const lines = [
    `Hello ${p.name},`,
    `${p.inviterName} has invited you to Bifolio, the group's shared research log.`,
    `Open the link below to choose your password. The link works once and expires in ${p.expiresHours} hours.`,
  ];
  return {
    to: p.to,
    subject: 'You are invited to Bifolio',
    text: `${lines.join('\n\n')}\n\n${p.link}\n`,
    html: layout(lines, { href: p.link, label: 'Set your password' }),
  };
}

export function resetMail(p: { to: string; name: string; link: string; expiresHours: number }): MailMessage {
  const lines = [
    `Hello ${p.name},`,
    'Someone asked to reset the password of your Bifolio account. If it was not you, ignore this message: your password stays as it is.',
    `Open the link below to choose a new password. The link works once and expires in ${p.expiresHours} hours.`,
  ];
  return {
    to: p.to,
    subject: 'Reset your Bifolio password',
    text: `${lines.join('\n\n')}\n\n${p.link}\n`,
    html: layout(lines, { href: p.link, label: 'Choose a new password' }),
  };
}
