import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { scanReportBodySchema } from '../../shared/schemas/codes';
import type { AppContext } from '../context';
import { badRequest, HttpError } from '../http/errors';
import { can } from '../http/guard';
import { modelYearOfVin, readinessAnswer, shopReadinessRule } from '../readiness/service';
import { readScanReport, type ReadinessJudge, SCAN_UPLOAD_LIMIT, textOfUpload } from './service';

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: SCAN_UPLOAD_LIMIT, files: 1, fields: 5, fieldSize: SCAN_UPLOAD_LIMIT } });

/** multer's own errors (size, wrong field, broken form) become client errors, never a 500. */
const fileUpload: RequestHandler = (req, res, next) => {
  upload.single('file')(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE' || err.code === 'LIMIT_FIELD_VALUE') return next(new HttpError(413, 'too_large', 'The report is over 1 MB. Upload only the trouble code part of the printout.'));
      if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(badRequest('Upload the report in the form field "file", one file at a time.'));
      return next(badRequest(`The upload could not be read (${err.message}).`));
    }
    next(badRequest('The upload could not be read. Try again, or paste the text instead.'));
  });
};

export function scanReportRoutes(ctx: AppContext) {
  const r = Router();

  r.post('/scan-reports', can('cases.write'), fileUpload, async (req, res) => {
    const rule = await shopReadinessRule(ctx, req.user!.shopId);
    const judge: ReadinessJudge = (readout, vin) => readinessAnswer(ctx, readout, rule, modelYearOfVin(vin));
    if (req.file) {
      res.json(readScanReport(textOfUpload(req.file.buffer), judge));
      return;
    }
    // A multipart form may carry the text in a "text" field instead of a file.
    const body = scanReportBodySchema.safeParse(req.body ?? {});
    if (!body.success) throw badRequest('Paste the report as text, or upload it as a file.', { text: body.error.issues[0]?.message ?? 'Required.' });
    res.json(readScanReport(body.data.text, judge));
  });

  return r;
}
