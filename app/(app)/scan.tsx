export { ScanScreen as default } from '@/features/scan/scan-screen';
