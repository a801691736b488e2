export { VehicleScreen as default } from '@/features/vehicles/vehicle-screen';
