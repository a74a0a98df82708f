import type { OutgoingMail } from './mailer.ts';

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function layout(paragraphs: string[], link: { href: string; label: string }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  return [
    '<!doctype html><html><body style="font-family: sans-serif; line-height: 1.5; color: #1f2933">',
    body,
    `<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>`,
    `<p style="color: #616e7c; font-size: 0.9em">If the button does not work, paste this address into your browser:<br>${escapeHtml(link.href)}</p>`,
    '<p>— Parley</p>',
    '</body></html>',
  ].join('\n');
}

export function inviteMail(options: { to: string; name: string; role: string; inviterName: string; organisation: string; link: string; validDays: number }): OutgoingMail {
  const lines = [
    `Hello ${options.name},`,
    `${options.inviterName} has invited you to ${options.organisation} on Parley with the ${options.role} role.`,
    `Choose a password to activate your account. The link works once and expires in ${options.validDays} days.`,
  ];
  return {
    to: options.to,
    subject: `You are invited to ${options.organisation} on Parley`,
    text: `${lines.join('\n\n')}\n\n${options.link}\n\n— Parley\n`,
    html: layout(lines, { href: options.link, label: 'Accept the invitation' }),
  };
}

export function resetMail(options: { to: string; name: string; link: string; validMinutes: number }): OutgoingMail {
  const lines = [
    `Hello ${options.name},`,
    'Someone asked to reset the password of your Parley account. If it was you, choose a new password with the link below.',
    `The link works once and expires in ${options.validMinutes} minutes. If you did not ask, ignore this message: your password stays as it is.`,
  ];
  return {
    to: options.to,
    subject: 'Reset your Parley password',
    text: `${lines.join('\n\n')}\n\n${options.link}\n\n— Parley\n`,
    html: layout(lines, { href: options.link, label: 'Choose a new password' }),
  };
}
