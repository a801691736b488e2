import { Link, useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { z } from 'zod';
import { passwordSchema, PASSWORD_RECOMMENDED } from '../../shared/schemas/auth';
import { api } from '../api/client';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { AuthFrame } from './auth-frame';
import { useForm } from './use-form';

const choosePasswordSchema = z
  .object({ password: passwordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords differ.' });

/** Accepting an invite and resetting a password both end here, with the token from the e-mail. */
export function SetPasswordScreen() {
  const { token, kind } = useLocalSearchParams<{ token?: string; kind?: string }>();
  const [done, setDone] = useState(false);
  const form = useForm(choosePasswordSchema, { password: "", repeat: "" });
  const invite = kind === 'invite';
  const onSubmit = () =>
    form.submit(async ({ password }) => {
      await api('/api/auth/reset', { method: 'POST', body: { token: token ?? '', password } });
      setDone(true);
    });
  if (!token) {
    return (
      <AuthFrame title="This link is incomplete">
        <Text>Open the link from the e-mail again, or ask for a new one.</Text>
        <Link href="/forgot-password">
          <Text tone="tide">Ask for a new link</Text>
        </Link>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title={invite ? 'Welcome: choose your password' : 'Choose a new password'}>
      {done ? (
        <>
          <Notice tone="success">Password saved. Sign in with it now.</Notice>
          <Link href="/sign-in">
            <Text tone="tide" weight="semibold">
              Go to sign in
            </Text>
          </Link>
        </>
      ) : (
        <>
          {form.formError ? <Notice tone="error">{form.formError}</Notice> : null}
          <TextField label="New password" value={form.values.password} onChangeText={form.set('password')} error={form.fieldErrors.password} hint={`At least 8 characters; ${PASSWORD_RECOMMENDED} or more is better.`} secureTextEntry autoComplete="new-password" />
          <TextField label="Repeat it" value={form.values.repeat} onChangeText={form.set('repeat')} error={form.fieldErrors.repeat} secureTextEntry autoComplete="new-password" onSubmitEditing={onSubmit} />
          <Button label="Save password" onPress={onSubmit} busy={form.busy} />
        </>
      )}
    </AuthFrame>
  );
}
