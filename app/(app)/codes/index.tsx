export { CodesScreen as default } from '@/features/codes/codes-screen';
