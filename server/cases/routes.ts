import { Router } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { idParamsSchema } from '../../shared/schemas/auth';
import {
  ATTACHMENT_MAX_BYTES,
  caseCreateSchema,
  caseListQuerySchema,
  casePatchSchema,
  causeSuggestRequestSchema,
  commentSchema,
  confirmSchema,
  returnSchema,
} from '../../shared/schemas/cases';
import type { AppContext } from '../context';
import { badRequest } from '../http/errors';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { readAttachment, saveAttachment } from './attachments';
import { listShopCauses, suggestionsForCase } from './cause-links';
import { exportCase } from './import-export';
import { extractFromNote } from './markdown';
import { getCaseDetail, listCases, listTags } from './queries';
import { diffRevisions, listRevisions } from './revisions';
import { commentOnCase, confirmFix, createCase, deleteCase, publishCase, returnCase, StaleVersionError, submitCase, updateCase } from './service';

const diffQuerySchema = z.object({ from: z.coerce.number().int().positive(), to: z.coerce.number().int().positive() });
const previewSchema = z.strictObject({ body: z.string().max(200_000), codes: z.array(z.string().max(20)).max(40).optional() });

// One file per request, held in memory just long enough to check its bytes.
// Browsers send the file name as raw UTF-8; multer would read it as latin1 (🚗 became ð\u009f\u009a\u0097).
const upload = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: ATTACHMENT_MAX_BYTES, files: 1, fields: 5, parts: 6 } });

export function caseRoutes(ctx: AppContext) {
  const r = Router();
  const id = validate('params', idParamsSchema);
  const caseId = (req: Parameters<typeof valid>[0]) => valid(req, 'params', idParamsSchema).id;
  const detail = async (req: Parameters<typeof valid>[0]) => ({ case: await getCaseDetail(ctx, req.user!, caseId(req)) });

  r.get('/cases', can('cases.read'), validate('query', caseListQuerySchema), async (req, res) => {
    res.json(await listCases(ctx, req.user!, valid(req, 'query', caseListQuerySchema)));
  });

  r.post('/cases', can('cases.write'), validate('body', caseCreateSchema), async (req, res) => {
    res.status(201).json(await createCase(ctx, req.user!, valid(req, 'body', caseCreateSchema)));
  });

  r.post('/cases/preview', can('cases.write'), validate('body', previewSchema), (req, res) => {
    const { body, codes } = valid(req, 'body', previewSchema);
    res.json(extractFromNote(body, codes));
  });

  r.get('/cases/causes', can('cases.read'), async (req, res) => {
    res.json({ causes: await listShopCauses(ctx, req.user!.shopId) });
  });

  r.post('/cases/cause-suggestions', can('cases.write'), validate('body', causeSuggestRequestSchema), async (req, res) => {
    const input = valid(req, 'body', causeSuggestRequestSchema);
    const facts = { ...input, shopId: req.user!.shopId, platformId: input.platformId ?? null, title: input.title ?? '', rootCause: input.rootCause ?? null, fix: input.fix ?? null };
    res.json({ suggestions: await suggestionsForCase(ctx, facts) });
  });

  r.get('/cases/:id', can('cases.read'), id, async (req, res) => {
    res.json(await detail(req));
  });

  r.patch('/cases/:id', can('cases.write'), id, validate('body', casePatchSchema), async (req, res) => {
    try {
      res.json(await updateCase(ctx, req.user!, caseId(req), valid(req, 'body', casePatchSchema)));
    } catch (err) {
      if (!(err instanceof StaleVersionError)) throw err;
      // The 409 carries the case as it is now, so the editor can show both and lose nothing.
      res.status(409).json({ error: { code: err.code, message: err.message }, currentVersion: err.currentVersion, current: (await detail(req)).case });
    }
  });

  r.delete('/cases/:id', can('cases.delete'), id, async (req, res) => {
    await deleteCase(ctx, req.user!, caseId(req));
    res.status(204).end();
  });

  r.post('/cases/:id/submit', can('cases.write'), id, async (req, res) => {
    await submitCase(ctx, req.user!, caseId(req));
    res.json(await detail(req));
  });

  r.post('/cases/:id/publish', can('cases.review'), id, async (req, res) => {
    await publishCase(ctx, req.user!, caseId(req));
    res.json(await detail(req));
  });

  r.post('/cases/:id/return', can('cases.review'), id, validate('body', returnSchema), async (req, res) => {
    await returnCase(ctx, req.user!, caseId(req), valid(req, 'body', returnSchema).comment);
    res.json(await detail(req));
  });

  r.post('/cases/:id/confirm', can('cases.review'), id, validate('body', confirmSchema), async (req, res) => {
    const { note, cause } = valid(req, 'body', confirmSchema);
    await confirmFix(ctx, req.user!, caseId(req), note, cause);
    res.json(await detail(req));
  });

  r.post('/cases/:id/comments', can('cases.read'), id, validate('body', commentSchema), async (req, res) => {
    await commentOnCase(ctx, req.user!, caseId(req), valid(req, 'body', commentSchema).body);
    res.status(201).json(await detail(req));
  });

  r.get('/cases/:id/revisions', can('cases.read'), id, async (req, res) => {
    res.json({ revisions: await listRevisions(ctx, req.user!, caseId(req)) });
  });

  r.get('/cases/:id/diff', can('cases.read'), id, validate('query', diffQuerySchema), async (req, res) => {
    const { from, to } = valid(req, 'query', diffQuerySchema);
    res.json(await diffRevisions(ctx, req.user!, caseId(req), from, to));
  });

  r.get('/cases/:id/export', can('cases.read'), id, async (req, res) => {
    const { fileName, text } = await exportCase(ctx, req.user!, caseId(req));
    res.type('text/markdown; charset=utf-8').attachment(fileName).send(text);
  });

  r.post('/cases/:id/attachments', can('cases.write'), id, upload.single('file'), async (req, res) => {
    if (!req.file) throw badRequest('Send the file in the multipart field "file".', { file: 'Choose a file.' });
    res.status(201).json(await saveAttachment(ctx, req.user!, caseId(req), req.file));
  });

  r.get('/attachments/:id', can('cases.read'), id, async (req, res) => {
    const file = await readAttachment(ctx, req.user!, caseId(req));
    const inline = file.mime.startsWith('image/');
    res.setHeader('Content-Type', file.mime);
    res.setHeader('Content-Disposition', `${inline ? 'inline' : 'attachment'}; filename="${file.name.replace(/[^\x20-\x7e]/g, '_')}"; filename*=UTF-8''${encodeURIComponent(file.name)}`);
    // Even if a browser sniffed it, nothing in an attachment may run.
    res.setHeader('Content-Security-Policy', "default-src 'none'; img-src 'self'; sandbox");
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Cache-Control', 'private, max-age=3600');
    res.send(file.data);
  });

  r.get('/tags', can('cases.read'), async (req, res) => {
    res.json({ tags: await listTags(ctx, req.user!) });
  });

  return r;
}
