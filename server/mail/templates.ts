// Plain-text first, HTML beside it; every message reads well in either.
import type { OutgoingMail } from './mailer';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** A message from paragraphs and an optional action link. */
export function composeMail(to: string | string[], subject: string, paragraphs: string[], action?: { label: string; url: string }): OutgoingMail {
  const textParts = [...paragraphs];
  if (action) textParts.push(`${action.label}: ${action.url}`);
  textParts.push('-- Causeway');
  const htmlParts = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`);
  if (action) htmlParts.push(`<p><a href="${escapeHtml(action.url)}">${escapeHtml(action.label)}</a></p>`);
  htmlParts.push('<p style="color:#66737A">Causeway</p>');
  return {
    to,
    subject,
    text: textParts.join('\n\n') + '\n',
    html: `<!doctype html><html><body style="font-family:Georgia,serif;line-height:1.5">${htmlParts.join('')}</body></html>`,
  };
}

export function inviteMail(to: string, invitee: string, inviter: string, shopName: string, url: string) {
  return composeMail(
    to,
    `${inviter} invited you to ${shopName} on Causeway`,
    [
      `Hello ${invitee},`,
      `${inviter} added you to ${shopName}'s Causeway, where the shop keeps its case notes and confirmed fixes.`,
      'Set your password with the link below. It works once and expires in 72 hours.',
    ],
    { label: 'Set your password', url },
  );
}

export function resetMail(to: string, name: string, url: string) {
  return composeMail(
    to,
    'Reset your Causeway password',
    [
      `Hello ${name},`,
      'Someone asked to reset the password of this Causeway account. If it was you, use the link below. It works once and expires in 30 minutes.',
      'If it was not you, ignore this message: your password stays as it is.',
    ],
    { label: 'Choose a new password', url },
  );
}
