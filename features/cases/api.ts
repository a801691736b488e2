// Case-notes data: SWR hooks over the shared/ contract, and the mutations.
import { z } from 'zod';
import {
  attachmentSchema,
  caseCreateSchema,
  caseDetailSchema,
  caseListResponseSchema,
  casePatchSchema,
  caseResponseSchema,
  causeListSchema,
  causeSuggestResponseSchema,
  noteExtractSchema,
  revisionDiffSchema,
  revisionListSchema,
  tagsResponseSchema,
  type Attachment,
  type CaseDetail,
} from '../../shared/schemas/cases';
import { api, ApiError } from '../api/client';
import { useApi } from '../api/use-api';

export const casePath = (id: number) => `/api/cases/${id}`;

export const useCaseList = (query: string) => useApi(`/api/cases${query ? `?${query}` : ''}`, caseListResponseSchema, { keepPreviousData: true });
export const useCase = (id: number | null) => useApi(id ? casePath(id) : null, caseResponseSchema);
export const useRevisions = (id: number) => useApi(`${casePath(id)}/revisions`, revisionListSchema);
export const useDiff = (id: number, from: number | null, to: number | null) =>
  useApi(from && to && from !== to ? `${casePath(id)}/diff?from=${from}&to=${to}` : null, revisionDiffSchema);
export const useTags = () => useApi('/api/tags', tagsResponseSchema);
export const useShopCauses = () => useApi('/api/cases/causes', causeListSchema);

export interface SuggestBody {
  title: string;
  rootCause: string;
  fix: string;
  platformId: number | null;
  codes: string[];
  symptoms: string[];
}
export const suggestCauses = (body: SuggestBody) => api('/api/cases/cause-suggestions', { method: 'POST', body }, causeSuggestResponseSchema);

const platformOptionSchema = z.object({ id: z.number(), make: z.string(), model: z.string(), engine: z.string(), yearFrom: z.number().optional(), yearTo: z.number().optional() });
export type PlatformOption = z.infer<typeof platformOptionSchema>;
export const usePlatforms = () => useApi('/api/platforms', z.object({ platforms: z.array(platformOptionSchema) }));

const savedSchema = z.object({ id: z.number(), version: z.number() });
export type Saved = z.infer<typeof savedSchema>;

/** The body sent as JSON; input types (before the server's normalising transforms). */
export type CreateBody = z.input<typeof caseCreateSchema>;
export type PatchBody = z.input<typeof casePatchSchema>;

export const createCase = (body: CreateBody) => api('/api/cases', { method: 'POST', body }, savedSchema);
export const patchCase = (id: number, body: PatchBody) => api(casePath(id), { method: 'PATCH', body }, savedSchema);
export const deleteCase = (id: number) => api(casePath(id), { method: 'DELETE' });

type Action = 'submit' | 'publish' | 'return' | 'confirm' | 'comments';
export const caseAction = (id: number, action: Action, body: Record<string, string> = {}) => api(`${casePath(id)}/${action}`, { method: 'POST', body }, caseResponseSchema);

export const previewNote = (body: string) => api('/api/cases/preview', { method: 'POST', body: { body } }, noteExtractSchema);

/** The server's copy from a 409 answer, so the editor can show both versions. */
export function conflictCurrent(err: unknown): CaseDetail | null {
  if (!(err instanceof ApiError) || err.status !== 409) return null;
  const parsed = z.object({ current: caseDetailSchema }).safeParse(err.body);
  return parsed.success ? parsed.data.current : null;
}

export const exportUrl = (id: number) => `${casePath(id)}/export`;

async function csrfToken(): Promise<string> {
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  return ((await res.json()) as { token: string }).token;
}

function uploadError(xhr: XMLHttpRequest): ApiError {
  try {
    const body = JSON.parse(xhr.responseText) as { error?: { code?: string; message?: string } };
    if (body.error?.message) return new ApiError(xhr.status, body.error.code ?? 'upload', body.error.message);
  } catch {
    // not JSON: fall through to a generic message
  }
  if (xhr.status === 413) return new ApiError(413, 'too_large', 'That file is larger than 15 MB.');
  return new ApiError(xhr.status, 'upload', xhr.status === 0 ? 'The upload stopped: no connection.' : `The upload failed (${xhr.status}).`);
}

/** Multipart upload through XMLHttpRequest, which (unlike fetch) reports upload progress (0..1). */
export async function uploadAttachment(caseId: number, file: Blob & { name?: string }, onProgress: (fraction: number) => void): Promise<Attachment> {
  const token = await csrfToken().catch(() => {
    throw new ApiError(0, 'offline', 'No connection to Causeway. The file was not sent.');
  });
  const form = new FormData();
  form.append('file', file, file.name ?? 'file');
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${casePath(caseId)}/attachments`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('X-CSRF-Token', token);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      if (xhr.status !== 201 && xhr.status !== 200) return reject(uploadError(xhr));
      const parsed = attachmentSchema.safeParse(JSON.parse(xhr.responseText));
      if (parsed.success) resolve(parsed.data);
      else reject(new ApiError(xhr.status, 'bad_response', 'The server answered in a way this screen does not understand.'));
    };
    xhr.onerror = () => reject(uploadError(xhr));
    xhr.send(form);
  });
}
