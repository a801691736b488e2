// Paste the data bytes of a service $03 answer (or any run of 2-byte codes) and read the codes.
import { useState } from 'react';
import { ApiError } from '../api/client';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Card, Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { decodeBytes } from './api';
import { CodeLink } from './code-link';

export function DecodeTool() {
  const t = useTheme();
  const [hex, setHex] = useState('');
  const [codes, setCodes] = useState<string[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const run = async () => {
    setBusy(true);
    setError(null);
    try {
      setCodes((await decodeBytes(hex)).codes);
    } catch (err) {
      setCodes(null);
      const field = err instanceof ApiError ? err.fields.pairs : undefined;
      setError(field ?? (err instanceof Error ? err.message : 'Could not decode those bytes.'));
    } finally {
      setBusy(false);
    }
  };
  return (
    <Card>
      <Heading level={3}>Decode bytes</Heading>
      <Text tone="slate" variant="small">
        Paste the code bytes of a mode $03 answer, two bytes per code (SAE J1979), e.g. 01 33 C1 00. 00 00 is padding.
      </Text>
      <TextField label="Hex bytes" mono value={hex} onChangeText={setHex} onSubmitEditing={run} placeholder="0133C100" autoCapitalize="characters" autoCorrect={false} error={error ?? undefined} />
      <Button label="Decode" kind="secondary" onPress={run} busy={busy} disabled={hex.trim() === ''} />
      {codes ? (
        codes.length ? (
          <Row wrap style={{ gap: t.space.sm }} aria-label="Decoded codes">
            {codes.map((c, i) => (
              <CodeLink key={`${c}-${i}`} code={c} />
            ))}
          </Row>
        ) : (
          <Notice tone="info">Only padding (00 00): no codes stored.</Notice>
        )
      ) : null}
    </Card>
  );
}
