import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { useSchedulePreviewQuery } from '../../../hooks/queries/journeys';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { Schedule } from '../../../shared/journey/schedule-schema';
import { describeError } from '../../format/describe-error';
import { formatRelative, formatSlot } from '../../format/time';
import { SelectField } from '../../forms/select-field';
import { TextField } from '../../forms/text-field';
import { useTheme } from '../../theme';
import { Loading } from '../../ui/loading';
import { Text } from '../../ui/text';
import { errorUnder, type DraftErrors } from './check-draft';
import type { JourneyDraft } from './draft';

const KIND_OPTIONS = [
  { value: 'interval', label: 'Every so many seconds' },
  { value: 'cron', label: 'Cron expression (UTC)' },
] as const;

/** Waits until typing pauses before asking the server, so every keystroke is not a request. */
function useSettled<T>(value: T, ms = 350): T {
  const [settled, setSettled] = useState(value);
  const key = JSON.stringify(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(timer);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, ms]);
  return settled;
}

/** The schedule, with the next five slots beside it (slots carry the journey's stable offset). */
export function ScheduleField({
  draft,
  onChange,
  schedule,
  journeyId,
  errors,
}: {
  draft: JourneyDraft;
  onChange: (patch: Partial<JourneyDraft>) => void;
  /** The schedule when it is valid, else null. */
  schedule: Schedule | null;
  journeyId?: number;
  errors: DraftErrors;
}) {
  const theme = useTheme();
  const { atLeastTablet } = useBreakpoints();
  const settled = useSettled(schedule);
  const preview = useSchedulePreviewQuery(settled, journeyId);
  // While typing, the list still belongs to the previous schedule: do not show it as this one's.
  const stale = JSON.stringify(settled) !== JSON.stringify(schedule);
  const error = errorUnder(errors, 'schedule');
  return (
    <View style={{ flexDirection: atLeastTablet ? 'row' : 'column', gap: theme.space.xl }}>
      <View style={{ flex: 1, gap: theme.space.md }}>
        <SelectField
          label="Runs"
          accessibilityLabel="Kind of schedule"
          value={draft.scheduleKind}
          options={KIND_OPTIONS}
          onChange={(scheduleKind) => onChange({ scheduleKind })}
          testID="journey-schedule-kind"
        />
        {draft.scheduleKind === 'interval' ? (
          <TextField
            label="Every (seconds)"
            hint="At least 10. Journeys are spread over the interval by a stable offset."
            value={draft.everySeconds}
            onChangeText={(everySeconds) => onChange({ everySeconds })}
            error={error}
            testID="journey-every-seconds"
            mono
            keyboardType="number-pad"
          />
        ) : (
          <TextField
            label="Cron expression"
            hint="Five fields, evaluated in UTC: minute hour day-of-month month day-of-week."
            value={draft.cronExpression}
            onChangeText={(cronExpression) => onChange({ cronExpression })}
            error={error}
            testID="journey-cron"
            mono
            autoCapitalize="none"
          />
        )}
      </View>
      <View testID="journey-schedule-preview" style={{ flex: 1, gap: theme.space.xs }}>
        <Text variant="label">Next five runs</Text>
        {schedule === null ? (
          <Text variant="small" tone="muted">
            Shown once the schedule is valid.
          </Text>
        ) : stale || preview.isPending ? (
          <Loading label="Working them out…" />
        ) : preview.isError ? (
          <Text variant="small" tone="bad">
            {describeError(preview.error)}
          </Text>
        ) : (
          preview.data.map((time, i) => (
            <View
              key={time}
              testID={`journey-schedule-preview-${i}`}
              // The exact instant, for tools and tests; people read the formatted one.
              {...({ dataSet: { time } } as object)}
              style={{ flexDirection: 'row', justifyContent: 'space-between', gap: theme.space.md }}
            >
              <Text variant="numberSmall">{formatSlot(time)}</Text>
              <Text variant="caption" tone="muted">
                {formatRelative(time)}
              </Text>
            </View>
          ))
        )}
        {schedule !== null ? (
          <Text variant="caption" tone="faint">
            In your local time{journeyId ? '' : '; the offset is final once the journey is saved'}.
          </Text>
        ) : null}
      </View>
    </View>
  );
}
