export { PlatformScreen as default } from '@/features/platforms/platform-screen';
