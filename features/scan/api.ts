import { scanReportResponseSchema } from '../../shared/schemas/codes';
import { api } from '../api/client';

export const readPastedReport = (text: string) => api('/api/scan-reports', { method: 'POST', body: { text } }, scanReportResponseSchema);

export function readUploadedReport(file: File) {
  const form = new FormData();
  form.append('file', file, file.name);
  return api('/api/scan-reports', { method: 'POST', form }, scanReportResponseSchema);
}
