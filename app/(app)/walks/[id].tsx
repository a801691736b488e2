export { WalkScreen as default } from '@/features/walks/walk-screen';
