import { Linking, Platform } from 'react-native';
import { digestSentSchema, patternsResponseSchema, type CsvTable } from '../../shared/schemas/patterns';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export interface PeriodQuery {
  from?: string;
  to?: string;
  platformId?: number | null;
}

const query = (q: PeriodQuery) => {
  const params = new URLSearchParams();
  if (q.from) params.set('from', q.from);
  if (q.to) params.set('to', q.to);
  if (q.platformId) params.set('platformId', String(q.platformId));
  return params.toString();
};

export const patternsPath = (q: PeriodQuery) => `/api/patterns?${query(q)}`;
export const usePatterns = (q: PeriodQuery | null) => useApi(q ? patternsPath(q) : null, patternsResponseSchema, { keepPreviousData: true });

export const csvPath = (table: CsvTable, q: PeriodQuery) => `/api/patterns.csv?table=${table}&${query(q)}`;

/** A real file download: the server answers with Content-Disposition: attachment. */
export function downloadCsv(table: CsvTable, q: PeriodQuery) {
  const path = csvPath(table, q);
  if (Platform.OS === 'web' && typeof document !== 'undefined') {
    const a = document.createElement('a');
    a.href = path;
    a.download = '';
    a.rel = 'noopener';
    document.body.appendChild(a);
    a.click();
    a.remove();
    return;
  }
  void Linking.openURL(path);
}

export const sendDigestNow = () => api('/api/digest/send', { method: 'POST' }, digestSentSchema);
