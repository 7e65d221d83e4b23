import { router } from 'expo-router';
import { View } from 'react-native';
import { useServicesQuery } from '../../../hooks/queries/services';
import { useSessionUser } from '../../../hooks/queries/session';
import { isAdmin } from '../../auth/roles';
import { describeError } from '../../format/describe-error';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Loading } from '../../ui/loading';
import { Notice } from '../../ui/notice';
import { Screen } from '../../ui/screen';
import { canWriteSignals } from '../roles';
import { SendMetricsHelp } from './send-metrics-help';
import { ServiceCard } from './service-card';

export function ServicesScreen() {
  const writer = canWriteSignals(useSessionUser());
  return (
    <Screen
      title="Signals"
      description="Your services and the metrics they report about themselves: request and error counters, latency histograms, gauges. Open a signal to chart it."
      actions={<ServicesActions writer={writer} />}
      testID="signals-services"
    >
      <ServicesContent writer={writer} />
    </Screen>
  );
}

function ServicesActions({ writer }: { writer: boolean }) {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm }}>
      <Button label="Explore" kind="primary" icon="activity" onPress={() => router.push('/signals/explore')} testID="signals-explore" />
      {writer ? <Button label="Upload CSV" icon="upload" onPress={() => router.push('/signals/upload')} testID="signals-upload" /> : null}
    </View>
  );
}

function ServicesContent({ writer }: { writer: boolean }) {
  const theme = useTheme();
  const user = useSessionUser();
  const services = useServicesQuery();
  if (services.isPending) return <Loading label="Loading services…" />;
  if (services.isError) {
    return (
      <Notice tone="bad" title="Could not load services">
        {describeError(services.error, user?.role)}
      </Notice>
    );
  }
  if (services.data.length === 0) return <SendMetricsHelp writer={writer} admin={isAdmin(user)} />;
  // Services that have reported most recently first; silent ones (or ones only named) after.
  const ordered = [...services.data].sort(
    (a, b) => (b.lastSampleAt ? Date.parse(b.lastSampleAt) : 0) - (a.lastSampleAt ? Date.parse(a.lastSampleAt) : 0) || a.name.localeCompare(b.name),
  );
  return (
    <View testID="services-list" style={{ gap: theme.space.xl }}>
      {ordered.map((service) => (
        <ServiceCard key={service.id} service={service} />
      ))}
    </View>
  );
}
