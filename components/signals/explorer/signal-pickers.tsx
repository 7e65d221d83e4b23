import { View } from 'react-native';
import type { ServiceView, SignalView } from '../../../shared/schemas/signals';
import { SelectField } from '../../forms/select-field';
import { useTheme } from '../../theme';

const NONE = '__none__';

/** Phones and tablets: the service and the signal as two selects, one above the other. */
export function SignalPickers({
  services,
  service,
  signals,
  signal,
  onService,
  onSignal,
}: {
  services: readonly ServiceView[];
  service: string | null;
  signals: readonly SignalView[] | undefined;
  signal: string | null;
  onService: (name: string) => void;
  onSignal: (name: string) => void;
}) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.md }}>
      <SelectField
        label="Service"
        accessibilityLabel="Service"
        value={service ?? NONE}
        options={[...(service ? [] : [{ value: NONE, label: 'Choose a service' }]), ...services.map((s) => ({ value: s.name, label: s.name }))]}
        onChange={(v) => v !== NONE && onService(v)}
        testID="explorer-service"
      />
      <SelectField
        label="Signal"
        accessibilityLabel="Signal"
        value={signal ?? NONE}
        options={[
          ...(signal ? [] : [{ value: NONE, label: signals ? 'Choose a signal' : 'Loading signals…' }]),
          ...(signals ?? []).map((s) => ({ value: s.name, label: `${s.name} · ${s.kind}` })),
        ]}
        onChange={(v) => v !== NONE && onSignal(v)}
        disabled={!service || !signals}
        testID="explorer-signal"
      />
    </View>
  );
}
