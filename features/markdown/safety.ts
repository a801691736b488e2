// What a case note may point at. Pure functions so they are unit-tested and shared by the
// parser (validateLink) and the render rules (defence in depth: both check).

const LINK_SCHEMES = ['http:', 'https:', 'mailto:'] as const;
const ATTACHMENT_PATH = /^\/api\/attachments\/([1-9][0-9]{0,15})$/;

// Control characters and whitespace inside a scheme ("java\tscript:") are what browsers ignore.
const squash = (url: string) => url.replace(/[\u0000-\u0020\u007f-\u009f]/g, '');

/** The href to use for a link in a note, or null when it must render as plain text (only http, https, mailto). */
export function safeLinkHref(href: string | null | undefined): string | null {
  if (!href) return null;
  const url = squash(href);
  const scheme = /^([a-z][a-z0-9+.-]*):/i.exec(url)?.[1]?.toLowerCase();
  if (!scheme) return null;
  if (!(LINK_SCHEMES as readonly string[]).includes(scheme + ':')) return null;
  if (scheme !== 'mailto' && !/^https?:\/\/[^/\s]/i.test(url)) return null;
  return url;
}

/** The attachment id of a same-origin `/api/attachments/<id>` URL, else null. */
export function attachmentIdFromUrl(src: string | null | undefined): number | null {
  if (!src) return null;
  const match = ATTACHMENT_PATH.exec(squash(src));
  return match?.[1] ? Number(match[1]) : null;
}

/** An image is shown only when it is one of this case's own attachments. */
export function safeImageSrc(src: string | null | undefined, attachmentIds: ReadonlySet<number>): string | null {
  const id = attachmentIdFromUrl(src);
  return id !== null && attachmentIds.has(id) ? `/api/attachments/${id}` : null;
}

/** For markdown-it's validateLink: anything that could become a link or an image of ours. */
export function acceptableUrl(url: string): boolean {
  return safeLinkHref(url) !== null || attachmentIdFromUrl(url) !== null;
}
