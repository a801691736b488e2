import { Link } from 'expo-router';
import { useState } from 'react';
import { resetRequestSchema } from '../../shared/schemas/auth';
import { api } from '../api/client';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { AuthFrame } from './auth-frame';
import { useForm } from './use-form';

export function ForgotPasswordScreen() {
  const [sent, setSent] = useState(false);
  const form = useForm(resetRequestSchema, { email: '' });
  const onSubmit = () =>
    form.submit(async (data) => {
      await api('/api/auth/reset-request', { method: 'POST', body: data });
      setSent(true);
    });
  return (
    <AuthFrame title="Reset the password" intro="We e-mail a link that works once and expires in 30 minutes.">
      {sent ? <Notice tone="success">If that address has an account, a reset link is on its way. Check the inbox.</Notice> : null}
      {form.formError ? <Notice tone="error">{form.formError}</Notice> : null}
      <TextField label="E-mail" value={form.values.email} onChangeText={form.set('email')} error={form.fieldErrors.email} autoComplete="email" autoCapitalize="none" inputMode="email" onSubmitEditing={onSubmit} />
      <Button label="Send reset link" onPress={onSubmit} busy={form.busy} />
      <Link href="/sign-in">
        <Text tone="tide">Back to sign in</Text>
      </Link>
    </AuthFrame>
  );
}
