import type { ReactNode } from 'react';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { Screen } from '../ui/screen';
import { TextLink } from '../ui/text-link';

/** A settings section page; on narrow screens it links back to the list of sections. */
export function SettingsPage({
  title,
  description,
  children,
  testID,
}: {
  title: string;
  description: string;
  children: ReactNode;
  testID: string;
}) {
  const { isWide } = useBreakpoints();
  const back = isWide ? undefined : <TextLink href="/settings" label="‹ Settings" variant="smallStrong" testID="settings-back" />;
  return (
    <Screen title={title} description={description} before={back} testID={testID}>
      {children}
    </Screen>
  );
}
