import { Router } from 'express';
import { checkVin } from '../../shared/vin';
import { codeListQuerySchema, codeParamsSchema, decodeQuerySchema, vinParamsSchema } from '../../shared/schemas/codes';
import type { AppContext } from '../context';
import { can } from '../http/guard';
import { valid, validate } from '../http/validate';
import { decodePairs, describeCode, listCodes } from './service';

export function codeRoutes(_ctx: AppContext) {
  const r = Router();

  r.get('/codes', can('codes.read'), validate('query', codeListQuerySchema), (req, res) => {
    res.json(listCodes(valid(req, 'query', codeListQuerySchema)));
  });

  // Before /codes/:code, or "decode" would be read as a code.
  r.get('/codes/decode', can('codes.read'), validate('query', decodeQuerySchema), (req, res) => {
    res.json({ codes: decodePairs(valid(req, 'query', decodeQuerySchema).pairs) });
  });

  r.get('/codes/:code', can('codes.read'), validate('params', codeParamsSchema), (req, res) => {
    res.json(describeCode(valid(req, 'params', codeParamsSchema).code));
  });

  return r;
}

/** VIN check: always 200 with the verdict and its reasons; only absurd input is a 400. */
export function vinRoutes(_ctx: AppContext) {
  const r = Router();
  r.get('/vin/:vin', can('platforms.read'), validate('params', vinParamsSchema), (req, res) => {
    res.json(checkVin(valid(req, 'params', vinParamsSchema).vin));
  });
  return r;
}
