// Plain-text first, HTML beside it; every message reads well in either.
import { escapeHtml } from '../../shared/html';
import type { OutgoingMail } from './mailer';

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

export function confirmSignupMail(to: string, name: string, shopName: string, url: string) {
  return composeMail(
    to,
    `Confirm your address to open ${shopName} on Causeway`,
    [
      `Hello ${name},`,
      `Someone, probably you, asked to create the shop ${shopName} on Causeway with this address. Choose your password with the link below to open it; you will be its manager.`,
      'The link works once and expires in 72 hours. If you did not ask for this, ignore this message and nothing happens.',
    ],
    { label: 'Choose your password', url },
  );
}

/** Sent instead of telling a sign-up form that the address is taken. */
export function accountExistsMail(to: string, name: string, resetUrl: string | null) {
  return composeMail(
    to,
    'This address already has a Causeway account',
    [
      `Hello ${name},`,
      'Someone tried to create a new shop with this address, which already has a Causeway account, so no new shop was made.',
      resetUrl
        ? 'If it was you, sign in as usual, or choose a new password with the link below (it works once and expires in 30 minutes). If it was not you, ignore this message.'
        : 'Your account is disabled; ask your shop manager to enable it. If it was not you, ignore this message.',
    ],
    resetUrl ? { label: 'Choose a new password', url: resetUrl } : undefined,
  );
}
