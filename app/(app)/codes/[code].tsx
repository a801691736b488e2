export { CodeScreen as default } from '@/features/codes/code-screen';
