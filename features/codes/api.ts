import { caseListResponseSchema } from '../../shared/schemas/cases';
import { codeDetailSchema, codeListResponseSchema, decodeResponseSchema, vinCheckSchema } from '../../shared/schemas/codes';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export interface CodeBrowse {
  q: string;
  system: string;
  page: number;
}

const browsePath = ({ q, system, page }: CodeBrowse) => {
  const params = new URLSearchParams({ page: String(page), pageSize: '25' });
  if (q.trim()) params.set('q', q.trim());
  if (system) params.set('system', system);
  return `/api/codes?${params.toString()}`;
};

export const useCodeList = (browse: CodeBrowse) => useApi(browsePath(browse), codeListResponseSchema, { keepPreviousData: true });
export const useCodeDetail = (code: string | null) => useApi(code ? `/api/codes/${encodeURIComponent(code)}` : null, codeDetailSchema, { shouldRetryOnError: false });

/** The shop's cases carrying a code (the cases API filters on the two-byte code or the full form). */
export const useCasesWithCode = (code: string | null) =>
  useApi(code ? `/api/cases?code=${encodeURIComponent(code)}&pageSize=20` : null, caseListResponseSchema, { shouldRetryOnError: false });

export const decodeBytes = (hex: string) => api(`/api/codes/decode?pairs=${encodeURIComponent(hex)}`, {}, decodeResponseSchema);
export const checkVinOnServer = (vin: string) => api(`/api/vin/${encodeURIComponent(vin)}`, {}, vinCheckSchema);
