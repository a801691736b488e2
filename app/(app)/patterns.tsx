export { PatternsScreen as default } from '@/features/patterns/patterns-screen';
