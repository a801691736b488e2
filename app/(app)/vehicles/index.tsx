export { VehiclesScreen as default } from '@/features/vehicles/vehicles-screen';
