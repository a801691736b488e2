export { NewPlatformScreen as default } from '@/features/platforms/new-platform-screen';
