import type { Href } from 'expo-router';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { Card } from '../ui/card';
import { Text } from '../ui/text';
import { TextLink } from '../ui/text-link';

interface Step {
  title: string;
  body: string;
  link?: { href: Href; label: string; testID: string };
}

function StepRow({ number, step }: { number: number; step: Step }) {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', gap: theme.space.lg }}>
      <View
        style={{
          width: theme.sizes.stepBadge,
          height: theme.sizes.stepBadge,
          borderRadius: theme.radii.pill,
          borderWidth: theme.borders.hairline,
          borderColor: theme.colors.lineStrong,
          alignItems: 'center',
          justifyContent: 'center',
        }}
      >
        <Text variant="numberSmall" tone="muted">
          {number}
        </Text>
      </View>
      <View style={{ flex: 1, gap: theme.space.xs }}>
        <Text variant="bodyStrong">{step.title}</Text>
        <Text variant="body" tone="muted">
          {step.body}
        </Text>
        {step.link ? <TextLink href={step.link.href} label={step.link.label} variant="smallStrong" testID={step.link.testID} /> : null}
      </View>
    </View>
  );
}

export function FirstStepsCard({ admin }: { admin: boolean }) {
  const theme = useTheme();
  const steps: Step[] = [
    {
      title: 'Add a journey',
      body: 'Write down a path a customer takes through your service (sign in, search, pay) as HTTP steps with checks. It runs on a schedule from each vantage.',
      link: { href: '/journeys', label: 'Go to Journeys', testID: 'now-step-journeys' },
    },
    {
      title: "Connect a service's metrics",
      body: 'Send request and error counters, latency histograms and gauges such as free disk, so Parallax can tell whether your own alerts saw what customers saw.',
      link: { href: '/signals', label: 'Go to Signals', testID: 'now-step-signals' },
    },
    admin
      ? {
          title: 'Invite people',
          body: 'Add engineers, release managers and reviewers, each with the role their work needs.',
          link: { href: '/settings/people', label: 'Go to People', testID: 'now-step-people' },
        }
      : {
          title: 'Invite people',
          body: 'Ask an admin to add the rest of your team; only admins manage people.',
        },
  ];
  return (
    <Card title="Start here" description="Three things make Parallax useful. Each one takes a few minutes." testID="now-first-steps">
      <View style={{ gap: theme.space.xl }}>
        {steps.map((step, index) => (
          <StepRow key={step.title} number={index + 1} step={step} />
        ))}
      </View>
    </Card>
  );
}
