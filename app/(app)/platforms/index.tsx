export { PlatformsScreen as default } from '@/features/platforms/platforms-screen';
