import { Link, useRouter } from 'expo-router';
import { useSWRConfig } from 'swr';
import { PASSWORD_RECOMMENDED, signupSchema } from '../../shared/schemas/auth';
import { api } from '../api/client';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { AuthFrame } from './auth-frame';
import { useForm } from './use-form';
import { ME_KEY } from './use-session';

export function SignUpScreen() {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const form = useForm(signupSchema, { shopName: '', name: '', email: '', password: '' });
  const onSubmit = () =>
    form.submit(async (data) => {
      const res = await api('/api/auth/signup', { method: 'POST', body: data });
      await mutate(ME_KEY, res, { revalidate: false });
      router.replace('/');
    });
  return (
    <AuthFrame title="Create your shop" intro="You become the shop's manager and can invite the rest of the team.">
      {form.formError ? <Notice tone="error">{form.formError}</Notice> : null}
      <TextField label="Shop name" value={form.values.shopName} onChangeText={form.set('shopName')} error={form.fieldErrors.shopName} autoComplete="organization" />
      <TextField label="Your name" value={form.values.name} onChangeText={form.set('name')} error={form.fieldErrors.name} autoComplete="name" />
      <TextField label="E-mail" value={form.values.email} onChangeText={form.set('email')} error={form.fieldErrors.email} autoComplete="email" autoCapitalize="none" inputMode="email" />
      <TextField
        label="Password"
        value={form.values.password}
        onChangeText={form.set('password')}
        error={form.fieldErrors.password}
        hint={`At least 8 characters; ${PASSWORD_RECOMMENDED} or more, like a short sentence, is better.`}
        secureTextEntry
        autoComplete="new-password"
      />
      <Button label="Create shop" onPress={onSubmit} busy={form.busy} />
      <Link href="/sign-in">
        <Text tone="tide">Already have an account? Sign in</Text>
      </Link>
    </AuthFrame>
  );
}
