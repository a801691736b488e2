import { useState } from 'react';
import { View } from 'react-native';
import { roleLabels, roles, type Role } from '../../shared/roles';
import { inviteSchema, type ShopUser } from '../../shared/schemas/auth';
import { ApiError } from '../api/client';
import { useForm } from '../auth/use-form';
import { useSession } from '../auth/use-session';
import { useTheme } from '../theme/use-theme';
import { Badge } from '../ui/badges';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { inviteUser, patchUser, useShopUsers } from './api';

const roleOptions = roles.map((r) => ({ value: r, label: roleLabels[r] }));

function InviteForm({ onInvited }: { onInvited: (name: string) => void }) {
  const [role, setRole] = useState<Role>('technician');
  const form = useForm(inviteSchema.omit({ role: true }), { name: '', email: '' });
  const onSubmit = () =>
    form.submit(async (data) => {
      await inviteUser({ ...data, role });
      form.set('name')('');
      form.set('email')('');
      onInvited(data.name);
    });
  return (
    <Card>
      <Heading level={2}>Invite someone</Heading>
      <Text tone="slate">They get an e-mail with a link to choose a password. The link works once and expires in 72 hours.</Text>
      {form.formError ? <Notice tone="error">{form.formError}</Notice> : null}
      <TextField label="Name" value={form.values.name} onChangeText={form.set('name')} error={form.fieldErrors.name} />
      <TextField label="E-mail" value={form.values.email} onChangeText={form.set('email')} error={form.fieldErrors.email} autoCapitalize="none" inputMode="email" />
      <Choice label="Role" options={roleOptions} value={role} onChange={setRole} />
      <Button label="Send invite" onPress={onSubmit} busy={form.busy} />
    </Card>
  );
}

function UserRow({ user, isSelf, onChanged }: { user: ShopUser; isSelf: boolean; onChanged: (msg: string | null, err?: string) => void }) {
  const t = useTheme();
  const [busy, setBusy] = useState(false);
  const change = async (patch: { role?: Role; disabled?: boolean }, done: string) => {
    setBusy(true);
    try {
      await patchUser(user.id, patch);
      onChanged(done);
    } catch (err) {
      onChanged(null, err instanceof ApiError ? err.message : 'Could not save the change.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Card style={{ gap: t.space.sm }}>
      <Row wrap style={{ justifyContent: 'space-between' }}>
        <View style={{ gap: 2, flexShrink: 1 }}>
          <Text weight="semibold">
            {user.name}
            {isSelf ? ' (you)' : ''}
          </Text>
          <Text variant="small" tone="slate">
            {user.email}
          </Text>
        </View>
        <Row wrap>
          <Badge label={roleLabels[user.role]} />
          {user.invited ? <Badge label="Invite sent" symbol="mail" tone="amber" /> : null}
          {user.disabled ? <Badge label="Disabled" symbol="ruledOut" tone="brick" /> : null}
        </Row>
      </Row>
      <Choice label={`Role of ${user.name}`} options={roleOptions} value={user.role} onChange={(r) => change({ role: r }, `${user.name} is now ${roleLabels[r]}.`)} />
      {!isSelf ? (
        <Button
          compact
          kind={user.disabled ? 'secondary' : 'danger'}
          busy={busy}
          label={user.disabled ? 'Enable account' : 'Disable account'}
          onPress={() => change({ disabled: !user.disabled }, user.disabled ? `${user.name} can sign in again.` : `${user.name} is signed out and cannot sign in.`)}
        />
      ) : null}
    </Card>
  );
}

export function TeamScreen() {
  const { user } = useSession();
  const { data, error, mutate } = useShopUsers();
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const changed = (msg: string | null, err?: string) => {
    setMessage(msg ? { tone: 'success', text: msg } : { tone: 'error', text: err ?? 'Failed.' });
    void mutate();
  };
  return (
    <Screen>
      <Heading>Team</Heading>
      <Text tone="slate">Who can sign in to {user?.shopName}, and what their role lets them do: apprentices and technicians write cases; senior techs review, publish and confirm fixes; managers also run the team.</Text>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      <InviteForm onInvited={(name) => changed(`Invite sent to ${name}.`)} />
      <Loaded data={data} error={error} retry={() => void mutate()}>
        {({ users }) => (
          <View style={{ gap: 12 }}>
            {users.map((u) => (
              <UserRow key={u.id} user={u} isSelf={u.id === user?.id} onChanged={changed} />
            ))}
          </View>
        )}
      </Loaded>
    </Screen>
  );
}
