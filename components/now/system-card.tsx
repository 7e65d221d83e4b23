import type { ReactNode } from 'react';
import { View } from 'react-native';
import type { HealthView, WorkerView } from '../../shared/api-types';
import { useHealthQuery } from '../../hooks/queries/health';
import { useWorkersQuery } from '../../hooks/queries/workers';
import { describeError } from '../format/describe-error';
import { formatRelative, formatTime } from '../format/time';
import { useTheme } from '../theme';
import { Card } from '../ui/card';
import { Divider } from '../ui/divider';
import { EmptyState } from '../ui/empty-state';
import { Loading } from '../ui/loading';
import { Notice } from '../ui/notice';
import { StatusMark } from '../ui/status-mark';
import { Text } from '../ui/text';

/** What is wrong with Parallax itself (the server, its database, a worker), in sentences; empty when well. */
export function systemProblems(health: HealthView | undefined, healthFailed: boolean, workers: WorkerView[] | undefined): string[] {
  const problems: string[] = [];
  if (healthFailed) problems.push('The health check did not answer.');
  else if (health && health.database !== 'ok') problems.push('The server cannot reach its database.');
  else if (health && health.status !== 'ok') problems.push('The server reports that it is degraded.');
  const down = workers?.filter((worker) => !worker.up) ?? [];
  if (down.length === 1) problems.push(`Worker ${down[0].name} has stopped sending heartbeats.`);
  else if (down.length > 1) problems.push(`${down.length} workers have stopped sending heartbeats.`);
  return problems;
}

function HealthRows({ health }: { health: HealthView }) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.md }}>
      <Row label="Server">
        <StatusMark tone={health.status === 'ok' ? 'good' : 'caution'} label={health.status === 'ok' ? 'Working' : 'Degraded'} testID="health-server" />
      </Row>
      <Row label="Database">
        <StatusMark tone={health.database === 'ok' ? 'good' : 'bad'} label={health.database === 'ok' ? 'Reachable' : 'Down'} testID="health-database" />
      </Row>
      <Row label="Checked">
        <Text variant="numberSmall" tone="muted">
          {formatTime(health.time)}
        </Text>
      </Row>
    </View>
  );
}

function Row({ label, children }: { label: string; children: ReactNode }) {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: theme.space.md, minHeight: theme.sizes.statusRow }}>
      <Text variant="small" tone="muted">
        {label}
      </Text>
      {children}
    </View>
  );
}

function WorkerRow({ worker }: { worker: WorkerView }) {
  const theme = useTheme();
  return (
    <View testID={`worker-${worker.name}`} style={{ gap: theme.space.xs }}>
      <View style={{ flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: theme.space.md }}>
        <Text variant="bodyStrong" numberOfLines={1} style={{ flexShrink: 1 }}>
          {worker.name}
        </Text>
        <StatusMark tone={worker.up ? 'good' : 'bad'} label={worker.up ? 'Up' : 'Down'} chip />
      </View>
      <Text variant="small" tone="muted">
        Last heartbeat <Text variant="numberSmall" tone="muted">{formatRelative(worker.lastBeatAt)}</Text>
        {' · '}started <Text variant="numberSmall" tone="muted">{formatRelative(worker.startedAt)}</Text>
      </Text>
    </View>
  );
}

export function SystemCard() {
  const theme = useTheme();
  const health = useHealthQuery();
  const workers = useWorkersQuery();
  return (
    <Card title="Parallax itself" description="The server, its database and the workers that run journeys." testID="now-system">
      {health.isPending ? (
        <Loading label="Checking the server…" />
      ) : health.isError ? (
        <Notice tone="bad" title="Health check failed">
          {describeError(health.error)}
        </Notice>
      ) : (
        <HealthRows health={health.data} />
      )}
      <Divider />
      <View style={{ gap: theme.space.lg }}>
        <Text variant="label" tone="muted">
          Workers
        </Text>
        {workers.isPending ? (
          <Loading label="Looking for workers…" />
        ) : workers.isError ? (
          <Notice tone="bad">{describeError(workers.error)}</Notice>
        ) : workers.data.length === 0 ? (
          <EmptyState
            title="No worker has reported yet"
            body="npm start starts one worker; it records a heartbeat every few seconds. If it stays empty, check the worker's output."
          />
        ) : (
          workers.data.map((worker) => <WorkerRow key={worker.name} worker={worker} />)
        )}
      </View>
    </Card>
  );
}
