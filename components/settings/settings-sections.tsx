import { Link, usePathname, type Href } from 'expo-router';
import { Pressable, View } from 'react-native';
import { useSessionUser } from '../../hooks/queries/session';
import type { Role } from '../../shared/roles';
import { isAdmin } from '../auth/roles';
import { useTheme } from '../theme';
import { Icon, type IconName } from '../ui/icon';
import { Text } from '../ui/text';

interface Section {
  href: Href;
  path: string;
  title: string;
  detail: string;
  icon: IconName;
  adminOnly: boolean;
  /** When set, only these roles see it (instead of adminOnly). */
  roles?: readonly Role[];
  testID: string;
}

const SECTIONS: readonly Section[] = [
  { href: '/settings', path: '/settings', title: 'Your account', detail: 'Name, email and role', icon: 'user', adminOnly: false, testID: 'settings-link-account' },
  { href: '/settings/people', path: '/settings/people', title: 'People', detail: 'Who can sign in, and their roles', icon: 'users', adminOnly: true, testID: 'settings-link-people' },
  { href: '/settings/tokens', path: '/settings/tokens', title: 'Access tokens', detail: 'Keys for pipelines and services', icon: 'key', adminOnly: true, testID: 'settings-link-tokens' },
  { href: '/settings/secrets', path: '/settings/secrets', title: 'Secrets', detail: 'Passwords and tokens journeys use', icon: 'lock', adminOnly: true, testID: 'settings-link-secrets' },
  { href: '/settings/vantages', path: '/settings/vantages', title: 'Vantages', detail: 'Where journeys run from, and whether they are up', icon: 'globe', adminOnly: false, testID: 'settings-link-vantages' },
  { href: '/settings/target-rules', path: '/settings/target-rules', title: 'Target rules', detail: 'Where probes may connect; run retention', icon: 'shield', adminOnly: true, testID: 'settings-link-target-rules' },
  { href: '/settings/collection-targets', path: '/settings/collection-targets', title: 'Collection targets', detail: 'JSON endpoints whose numbers are collected as signals', icon: 'download-cloud', adminOnly: false, roles: ['admin', 'engineer'], testID: 'settings-link-collection-targets' },
  { href: '/settings/maintenance-windows', path: '/settings/maintenance-windows', title: 'Maintenance windows', detail: 'Planned periods when alerts are recorded but not sent', icon: 'tool', adminOnly: false, testID: 'settings-link-maintenance-windows' },
  { href: '/settings/outgoing-mail', path: '/settings/outgoing-mail', title: 'Outgoing mail', detail: 'Messages the local mail sink received', icon: 'mail', adminOnly: true, testID: 'settings-link-outgoing-mail' },
];

/**
 * The list of settings sections: the left pane on wide screens, a list on Settings itself
 * on narrower ones. Sections a role may not use are not shown at all.
 */
export function SettingsSections({ pane }: { pane: boolean }) {
  const theme = useTheme();
  const c = theme.colors;
  const pathname = usePathname();
  const user = useSessionUser();
  const admin = isAdmin(user);
  const visible = SECTIONS.filter((section) => (section.roles ? !!user && section.roles.includes(user.role) : admin || !section.adminOnly)).filter((section) => pane || section.path !== '/settings');
  return (
    <View style={{ gap: theme.space.lg }}>
      <View style={{ gap: theme.space.xs }}>
        {visible.map((section) => {
          const current = pane && pathname === section.path;
          return (
            <Link key={section.path} href={section.href} asChild>
              <Pressable
                testID={section.testID}
                accessibilityRole="link"
                accessibilityState={{ selected: current }}
                // A plain style object: Link's asChild cannot pass a style function through.
                style={{
                  flexDirection: 'row',
                  alignItems: 'center',
                  gap: theme.space.md,
                  minHeight: theme.sizes.touchTarget,
                  paddingHorizontal: theme.space.md,
                  paddingVertical: pane ? theme.space.sm : theme.space.md,
                  borderRadius: theme.radii.md,
                  backgroundColor: current ? c.accentWash : pane ? 'transparent' : c.surface,
                  borderWidth: pane ? 0 : theme.borders.hairline,
                  borderColor: c.line,
                }}
              >
                <Icon name={section.icon} size={theme.sizes.iconSm} color={current ? c.accent : c.inkMuted} />
                <View style={{ flex: 1 }}>
                  <Text variant={current ? 'smallStrong' : pane ? 'small' : 'bodyStrong'} tone={current ? 'accent' : 'ink'}>
                    {section.title}
                  </Text>
                  {pane ? null : (
                    <Text variant="small" tone="muted">
                      {section.detail}
                    </Text>
                  )}
                </View>
                {pane ? null : <Icon name="chevron-right" size={theme.sizes.icon} color={c.inkFaint} />}
              </Pressable>
            </Link>
          );
        })}
      </View>
      <Text variant="caption" tone="faint" style={{ paddingHorizontal: pane ? theme.space.md : 0 }}>
        {admin
          ? 'Engineers manage maintenance windows too; outgoing mail is for admins.'
          : 'People, access tokens, secrets, target rules and outgoing mail are managed by admins.'}
      </Text>
    </View>
  );
}
