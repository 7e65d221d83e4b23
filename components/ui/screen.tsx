import type { ReactNode } from 'react';
import { ScrollView, View } from 'react-native';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { useTheme } from '../theme';
import { Text } from './text';

export interface ScreenProps {
  title: string;
  description?: string;
  /** Above the title: a back link on narrow screens. */
  before?: ReactNode;
  /** Beside the title on wide screens, under it on phones. */
  actions?: ReactNode;
  /** Cap the content at a comfortable reading width instead of the full column. */
  narrow?: boolean;
  children: ReactNode;
  testID?: string;
}

/** The outer part of every screen: paper, a capped and centred column, the title. */
export function Screen({ title, description, before, actions, narrow = false, children, testID }: ScreenProps) {
  const theme = useTheme();
  const { isPhone, isWide } = useBreakpoints();
  const padding = isPhone ? theme.space.lg : isWide ? theme.space.xxl : theme.space.xl;
  return (
    <ScrollView
      testID={testID}
      style={{ flex: 1, backgroundColor: theme.colors.paper }}
      contentContainerStyle={{ paddingHorizontal: padding, paddingTop: isPhone ? theme.space.xl : theme.space.xxl, paddingBottom: theme.space.huge }}
      keyboardShouldPersistTaps="handled"
    >
      <View
        style={{
          width: '100%',
          maxWidth: narrow ? theme.sizes.readingMax : theme.sizes.contentMax,
          alignSelf: 'center',
          gap: isPhone ? theme.space.xl : theme.space.xxl,
        }}
      >
        <View style={{ gap: theme.space.md }}>
          {before}
          <View
            style={{
              flexDirection: isPhone ? 'column' : 'row',
              alignItems: isPhone ? 'flex-start' : 'flex-end',
              justifyContent: 'space-between',
              gap: theme.space.md,
            }}
          >
            <View style={{ flexShrink: 1, gap: theme.space.xs }}>
              <Text variant={isPhone ? 'title' : 'display'} accessibilityRole="header">
                {title}
              </Text>
              {description ? (
                <Text variant="body" tone="muted" style={{ maxWidth: theme.sizes.readingMax }}>
                  {description}
                </Text>
              ) : null}
            </View>
            {actions}
          </View>
        </View>
        {children}
      </View>
    </ScrollView>
  );
}
