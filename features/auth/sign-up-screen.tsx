import { Link } from 'expo-router';
import { useState } from 'react';
import { signupSchema } from '../../shared/schemas/auth';
import { api } from '../api/client';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { AuthFrame } from './auth-frame';
import { useForm } from './use-form';

/**
 * The shop opens from the e-mailed link, where its manager chooses the password. The screen
 * answers the same whether or not the address already has an account: the mail says which.
 */
export function SignUpScreen() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm(signupSchema, { shopName: '', name: '', email: '' });
  const onSubmit = () =>
    form.submit(async (data) => {
      await api('/api/auth/signup', { method: 'POST', body: data });
      setSentTo(data.email);
    });
  return (
    <AuthFrame title="Create your shop" intro="You become the shop's manager and can invite the rest of the team.">
      {sentTo ? (
        <Notice tone="success">{`We sent a link to ${sentTo}. Open it to choose your password and open the shop; it works once and expires in 72 hours.`}</Notice>
      ) : null}
      {form.formError ? <Notice tone="error">{form.formError}</Notice> : null}
      <TextField label="Shop name" value={form.values.shopName} onChangeText={form.set('shopName')} error={form.fieldErrors.shopName} autoComplete="organization" />
      <TextField label="Your name" value={form.values.name} onChangeText={form.set('name')} error={form.fieldErrors.name} autoComplete="name" />
      <TextField
        label="E-mail"
        value={form.values.email}
        onChangeText={form.set('email')}
        error={form.fieldErrors.email}
        hint="We e-mail a link there; you choose your password from it."
        autoComplete="email"
        autoCapitalize="none"
        inputMode="email"
        onSubmitEditing={onSubmit}
      />
      <Button label="Create shop" onPress={onSubmit} busy={form.busy} />
      <Link href="/sign-in">
        <Text tone="tide">Already have an account? Sign in</Text>
      </Link>
    </AuthFrame>
  );
}
