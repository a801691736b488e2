// Attachments: photos, scans, PDFs, CSV and text. The type comes from the bytes, not the name;
// files live under .data/uploads with generated names, outside anything served statically.
import { createHash, randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { and, eq, isNull } from 'drizzle-orm';
import { attachments, cases } from '../../db/schema';
import { canEditCase, canSeeCase, type Actor } from '../../shared/policy';
import { ATTACHMENT_MAX_BYTES } from '../../shared/schemas/cases';
import type { AppContext } from '../context';
import { forbidden, HttpError, notFound } from '../http/errors';
import { attachmentUrl } from './queries';
import { loadVisibleCase } from './service';

const startsWith = (buf: Buffer, bytes: number[], at = 0) => bytes.every((b, i) => buf[at + i] === b);

/** The file's real type from its first bytes; text only when it is valid UTF-8 without NUL bytes. */
export function sniffType(buf: Buffer, name: string): string | null {
  if (startsWith(buf, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (startsWith(buf, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  if (startsWith(buf, [0x52, 0x49, 0x46, 0x46]) && startsWith(buf, [0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp';
  if (startsWith(buf, [0x25, 0x50, 0x44, 0x46, 0x2d])) return 'application/pdf';
  if (buf.includes(0)) return null;
  const text = buf.toString('utf8');
  if (text.includes('\uFFFD')) return null;
  // Markup is never accepted as "text": it could be rendered as a page somewhere else.
  if (/^\s*<(?:!doctype|html|svg|script|\?xml)/i.test(text)) return null;
  const ext = path.extname(name).toLowerCase();
  if (ext === '.csv') return 'text/csv';
  if (ext === '.txt' || ext === '.log' || ext === '') return 'text/plain';
  return null;
}

/** C0 and C1 controls, and the bidirectional marks, embeddings, overrides and isolates that can make "x\u202Egnp.exe" read as "xexe.png". */
const UNSAFE_IN_NAME = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069\ufeff"<>|:*?]/g;

/** A display name without folders, control or bidirectional characters, or anything a header could choke on. */
export function safeFileName(original: string): string {
  const base = original.split(/[\\/]/).pop() ?? '';
  const clean = base.replace(UNSAFE_IN_NAME, '').replace(/^\.+/, '').trim().slice(0, 150);
  return clean || 'file';
}

const EXTENSION: Record<string, string> = {
  'image/jpeg': '.jpg',
  'image/png': '.png',
  'image/webp': '.webp',
  'application/pdf': '.pdf',
  'text/csv': '.csv',
  'text/plain': '.txt',
};

export async function saveAttachment(ctx: AppContext, actor: Actor, caseId: number, file: { buffer: Buffer; originalname: string }) {
  const row = await loadVisibleCase(ctx.db, actor, caseId);
  if (!canEditCase(actor, row)) throw forbidden('Only people who can edit this case can attach files to it.');
  if (file.buffer.length > ATTACHMENT_MAX_BYTES) throw new HttpError(413, 'too_large', 'Files can be at most 15 MB.');
  if (file.buffer.length === 0) throw new HttpError(400, 'empty_file', 'That file is empty.');
  const mime = sniffType(file.buffer, file.originalname);
  if (!mime) throw new HttpError(415, 'unsupported_type', 'Attach photos (JPEG, PNG, WebP), PDFs, CSV or plain text. This file is none of those, whatever its name says.');
  let name = safeFileName(file.originalname);
  if (path.extname(name).toLowerCase() !== EXTENSION[mime] && !(mime === 'image/jpeg' && /\.jpe?g$/i.test(name))) name += EXTENSION[mime];
  const storedName = randomUUID();
  mkdirSync(ctx.config.uploadDir, { recursive: true });
  await writeFile(path.join(ctx.config.uploadDir, storedName), file.buffer, { mode: 0o600 });
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  const [inserted] = await ctx.db
    .insert(attachments)
    .values({ shopId: actor.shopId, caseId, storedName, originalName: name, mime, size: file.buffer.length, sha256, uploadedById: actor.id })
    .$returningId();
  return { id: inserted!.id, name, size: file.buffer.length, mime, url: attachmentUrl(inserted!.id), createdAt: new Date().toISOString() };
}

export async function readAttachment(ctx: AppContext, actor: Actor, id: number) {
  const [row] = await ctx.db
    .select({ a: attachments, authorId: cases.authorId, status: cases.status })
    .from(attachments)
    .innerJoin(cases, eq(cases.id, attachments.caseId))
    .where(and(eq(attachments.id, id), eq(attachments.shopId, actor.shopId), isNull(cases.deletedAt)));
  if (!row || !canSeeCase(actor, row)) throw notFound('That attachment');
  const data = await readFile(path.join(ctx.config.uploadDir, row.a.storedName)).catch(() => null);
  if (!data) throw notFound('That attachment file');
  return { data, mime: row.a.mime, name: row.a.originalName };
}
