import { Link, useRouter } from 'expo-router';
import { useSWRConfig } from 'swr';
import { loginSchema } from '../../shared/schemas/auth';
import { api } from '../api/client';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Row } from '../ui/surfaces';
import { Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { AuthFrame } from './auth-frame';
import { useForm } from './use-form';
import { ME_KEY } from './use-session';

export function SignInScreen() {
  const t = useTheme();
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const form = useForm(loginSchema, { email: '', password: '' });
  const onSubmit = () =>
    form.submit(async (data) => {
      const res = await api('/api/auth/login', { method: 'POST', body: data });
      await mutate(ME_KEY, res, { revalidate: false });
      router.replace('/');
    });
  return (
    <AuthFrame title="Sign in" intro="Use the e-mail address your shop manager invited.">
      {form.formError ? <Notice tone="error">{form.formError}</Notice> : null}
      <TextField label="E-mail" value={form.values.email} onChangeText={form.set('email')} error={form.fieldErrors.email} autoComplete="email" keyboardType="email-address" autoCapitalize="none" inputMode="email" />
      <TextField label="Password" value={form.values.password} onChangeText={form.set('password')} error={form.fieldErrors.password} secureTextEntry autoComplete="current-password" onSubmitEditing={onSubmit} />
      <Button label="Sign in" onPress={onSubmit} busy={form.busy} />
      <Row wrap style={{ justifyContent: 'space-between', gap: t.space.md }}>
        <Link href="/forgot-password">
          <Text tone="tide">Forgot the password?</Text>
        </Link>
        <Link href="/sign-up">
          <Text tone="tide">New shop? Create one</Text>
        </Link>
      </Row>
    </AuthFrame>
  );
}
