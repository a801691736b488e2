export { ShopSettingsScreen as default } from '@/features/shop/settings-screen';
