import { useBreakpoints } from '../../hooks/use-breakpoints';
import { Screen } from '../ui/screen';
import { TextLink } from '../ui/text-link';
import { AlertDetailView } from './alert-detail';

/** One alert on its own page (phones, and links from mail). */
export function AlertDetailScreen({ id }: { id: number }) {
  const { isWide } = useBreakpoints();
  return (
    <Screen
      title="Alert"
      narrow={!isWide}
      before={<TextLink href="/alerts" label="‹ Alerts" variant="smallStrong" testID="alert-back" />}
      testID="alert-detail-screen"
    >
      <AlertDetailView id={id} />
    </Screen>
  );
}
