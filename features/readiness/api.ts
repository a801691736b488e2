// Readiness data: case and vehicle snapshots, and adding one.
import { snapshotListSchema, snapshotSchema, type SnapshotView } from '../../shared/schemas/readiness';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export const caseReadinessPath = (caseId: number) => `/api/cases/${caseId}/readiness`;

export const useCaseReadiness = (caseId: number) => useApi(caseReadinessPath(caseId), snapshotListSchema);
export const useVehicleReadiness = (vehicleId: number) => useApi(`/api/vehicles/${vehicleId}/readiness`, snapshotListSchema);

/** Bare hex goes as `bytes` (PID $01 answer or the four data bytes); anything else as a printed table. */
export function snapshotBody(label: string, pasted: string) {
  const bare = /^[\s0-9a-f]+$/i.test(pasted);
  return bare ? { label, bytes: pasted } : { label, text: pasted };
}

export const addSnapshot = (caseId: number, label: string, pasted: string): Promise<SnapshotView> =>
  api(caseReadinessPath(caseId), { method: 'POST', body: snapshotBody(label, pasted) }, snapshotSchema);
