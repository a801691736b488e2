import { vehicleDetailSchema, vehicleListSchema } from '../../shared/schemas/patterns';
import { useApi } from '../api/use-api';

export const useVehicles = () => useApi('/api/vehicles', vehicleListSchema);
export const useVehicle = (id: number | null) => useApi(id ? `/api/vehicles/${id}` : null, vehicleDetailSchema);
