import { useState } from 'react';
import { Pressable, View } from 'react-native';
import { outboxResponseSchema, type OutboxMessage } from '../../shared/schemas/outbox';
import { useApi } from '../api/use-api';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';

const when = (date: string | null) => (date ? new Date(date).toLocaleString() : 'time unknown');

function Message({ message }: { message: OutboxMessage }) {
  const t = useTheme();
  const [open, setOpen] = useState(false);
  return (
    <Card style={{ gap: t.space.sm }}>
      <Pressable role="button" aria-expanded={open} onPress={() => setOpen(!open)} style={{ minHeight: t.layout.touchTarget, gap: 2 }}>
        <Text weight="semibold">{message.subject}</Text>
        <Text variant="small" tone="slate">
          To {message.to.join(', ')} · {when(message.date)}
        </Text>
      </Pressable>
      {open ? (
        <Text mono variant="small" selectable>
          {message.text}
        </Text>
      ) : null}
    </Card>
  );
}

/** Demo mode only: what Causeway e-mailed this shop's people, as the local mail catcher caught it. */
export function OutboxScreen() {
  const { data, error, mutate } = useApi('/api/outbox', outboxResponseSchema, { refreshInterval: 5000 });
  return (
    <Screen width="reading">
      <Row wrap style={{ justifyContent: 'space-between' }}>
        <Heading>Outbox</Heading>
        <Button compact kind="secondary" label="Refresh" onPress={() => void mutate()} />
      </Row>
      <Text tone="slate">In demo mode no e-mail leaves this machine: invites, resets, review requests and digests land here. Their one-time links are left out: a link would sign in as the person it was sent to.</Text>
      <Loaded data={data} error={error} retry={() => void mutate()}>
        {({ messages, notice }) =>
          notice ? (
            <Notice tone="error">{notice}</Notice>
          ) : messages.length === 0 ? (
            <EmptyState title="Nothing sent yet" hint="Invite someone from Team, or ask for a password reset, and the message shows up here." />
          ) : (
            <View style={{ gap: 12 }}>
              {messages.map((m) => (
                <Message key={m.id} message={m} />
              ))}
            </View>
          )
        }
      </Loaded>
    </Screen>
  );
}
