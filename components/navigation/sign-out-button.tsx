import { Pressable } from 'react-native';
import { useSignOutMutation } from '../../hooks/queries/session';
import { useTheme } from '../theme';
import { Icon } from '../ui/icon';
import { Text } from '../ui/text';

export function SignOutButton({ wide = false }: { wide?: boolean }) {
  const theme = useTheme();
  const signOut = useSignOutMutation();
  return (
    <Pressable
      testID="nav-sign-out"
      accessibilityRole="button"
      accessibilityLabel="Sign out"
      disabled={signOut.isPending}
      onPress={() => signOut.mutate()}
      style={({ pressed, hovered }: { pressed: boolean; hovered?: boolean }) => ({
        flexDirection: 'row',
        alignItems: 'center',
        gap: theme.space.sm,
        minHeight: theme.sizes.touchTarget,
        paddingHorizontal: theme.space.md,
        borderRadius: theme.radii.md,
        alignSelf: wide ? 'stretch' : 'auto',
        backgroundColor: hovered || pressed ? theme.colors.sunken : 'transparent',
        opacity: signOut.isPending ? 0.55 : 1,
      })}
    >
      <Icon name="log-out" size={theme.sizes.iconSm} color={theme.colors.inkMuted} />
      <Text variant="smallStrong" tone="muted">
        {signOut.isPending ? 'Signing out…' : 'Sign out'}
      </Text>
    </Pressable>
  );
}
