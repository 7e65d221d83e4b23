import { useState } from 'react';
import { Pressable, View } from 'react-native';
import { useOutgoingMailQuery } from '../../../hooks/queries/outgoing-mail';
import { useSessionUser } from '../../../hooks/queries/session';
import type { OutgoingMailItem } from '../../../shared/rules/api-schemas';
import { isAdmin } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { formatSlot } from '../../format/time';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { EmptyState } from '../../ui/empty-state';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Text } from '../../ui/text';
import { SettingsPage } from '../settings-page';

/** Admins: the messages the local SMTP sink received (development and tests send mail there). */
export function OutgoingMailScreen() {
  return (
    <SettingsPage
      title="Outgoing mail"
      description="What Parallax has sent, as the local mail sink received it, newest first. Alert mail carries the responder note first."
      testID="outgoing-mail-screen"
    >
      <OutgoingMailContent />
    </SettingsPage>
  );
}

function OutgoingMailContent() {
  const theme = useTheme();
  const admin = isAdmin(useSessionUser());
  const mail = useOutgoingMailQuery(50, { enabled: admin });
  if (!admin) return <Notice tone="info">Only admins read outgoing mail.</Notice>;
  if (mail.isPending) return <Loading label="Loading mail…" />;
  if (mail.isError) return <Notice tone="bad">{describeError(mail.error)}</Notice>;
  if (mail.data.items.length === 0) {
    return (
      <Card>
        <EmptyState testID="outgoing-mail-empty" title="No mail sent yet" body="Messages appear here when an alert with recipients is raised or cleared." />
      </Card>
    );
  }
  return (
    <View style={{ gap: theme.space.md }} testID="outgoing-mail-list">
      <Text variant="small" tone="muted">{`${mail.data.items.length} of ${mail.data.total} messages`}</Text>
      {mail.data.items.map((m) => (
        <MailRow key={m.id} mail={m} />
      ))}
    </View>
  );
}

function MailRow({ mail }: { mail: OutgoingMailItem }) {
  const theme = useTheme();
  const [open, setOpen] = useState(false);
  return (
    <Pressable onPress={() => setOpen((o) => !o)} accessibilityRole="button" accessibilityState={{ expanded: open }} testID={`outgoing-mail-${mail.id}`}>
      <Card>
        <Text variant="bodyStrong">{mail.subject || '(no subject)'}</Text>
        <Text variant="small" tone="muted">{`To ${mail.to.join(', ')} · from ${mail.from}`}</Text>
        <Text variant="numberSmall" tone="muted">
          {formatSlot(mail.receivedAt)}
        </Text>
        <Text variant="code" numberOfLines={open ? undefined : 3} style={{ backgroundColor: theme.colors.sunken, padding: theme.space.md, borderRadius: theme.radii.md }}>
          {mail.text}
        </Text>
        <Text variant="caption" tone="accent">
          {open ? 'Show less' : 'Show all'}
        </Text>
      </Card>
    </Pressable>
  );
}
