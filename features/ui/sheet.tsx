// A sheet that slides up from the bottom (centred at reading width on a wide screen):
// filters and choices that would otherwise push a phone's content below the fold.
import type { ReactNode } from 'react';
import { Modal, Pressable, ScrollView, View } from 'react-native';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Row } from './surfaces';
import { Heading } from './text';

interface SheetProps {
  open: boolean;
  title: string;
  onClose: () => void;
  onShow?: () => void;
  /** Beside the title, e.g. "Clear all". */
  action?: ReactNode;
  /** Stays below the scrolling part, e.g. the button that applies. */
  footer: ReactNode;
  children: ReactNode;
}

export function Sheet({ open, title, onClose, onShow, action, footer, children }: SheetProps) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  return (
    <Modal visible={open} transparent animationType="slide" onRequestClose={onClose} onShow={onShow}>
      <View style={{ flex: 1, justifyContent: 'flex-end', backgroundColor: t.colour.overlay }}>
        <Pressable accessibilityLabel={`Close ${title.toLowerCase()}`} style={{ flex: 1 }} onPress={onClose} />
        <View
          role="dialog"
          aria-label={title}
          style={{
            alignSelf: 'center',
            width: '100%',
            maxWidth: isWide ? t.layout.readingWidth : undefined,
            maxHeight: '85%',
            backgroundColor: t.colour.card,
            borderTopLeftRadius: t.radius.lg,
            borderTopRightRadius: t.radius.lg,
            padding: t.space.lg,
            gap: t.space.lg,
          }}
        >
          <Row style={{ justifyContent: 'space-between' }}>
            <Heading level={2}>{title}</Heading>
            {action}
          </Row>
          <ScrollView style={{ flexGrow: 0 }} contentContainerStyle={{ gap: t.space.md, paddingHorizontal: t.space.xxs }} keyboardShouldPersistTaps="handled">
            {children}
          </ScrollView>
          {footer}
        </View>
      </View>
    </Modal>
  );
}
