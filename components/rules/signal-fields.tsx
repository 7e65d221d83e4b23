import { useMemo } from 'react';
import { useServicesQuery } from '../../hooks/queries/services';
import { useSignalsQuery } from '../../hooks/queries/signals';
import { RULE_SIGNAL_KINDS, type RuleKind } from '../../shared/rules/rule-schema';
import type { SignalKind } from '../../shared/schemas/signals';
import { SelectField } from '../forms/select-field';

const NONE = '';

/** The service, then one of its signals of a kind the rule reads. */
export function ServicePicker({ value, onChange, error, testID = 'rule-service' }: { value: string; onChange: (v: string) => void; error?: string; testID?: string }) {
  const services = useServicesQuery();
  const options = useMemo(
    () => [{ value: NONE, label: services.isPending ? 'Loading…' : 'Choose a service' }, ...(services.data ?? []).map((s) => ({ value: s.name, label: s.name }))],
    [services.data, services.isPending],
  );
  return (
    <SelectField
      label="Service"
      accessibilityLabel="Service"
      value={value}
      options={options}
      onChange={onChange}
      error={error}
      hint={services.data && services.data.length === 0 ? 'No service has sent metrics yet (see Signals).' : undefined}
      testID={testID}
    />
  );
}

export function SignalPicker({
  service,
  kind,
  value,
  onChange,
  error,
  label = 'Signal',
  kinds,
  testID = 'rule-signal',
}: {
  service: string;
  kind: RuleKind;
  value: string;
  onChange: (v: string) => void;
  error?: string;
  label?: string;
  kinds?: readonly SignalKind[];
  testID?: string;
}) {
  const signals = useSignalsQuery(service || null);
  const allowed = kinds ?? RULE_SIGNAL_KINDS[kind];
  const fitting = (signals.data ?? []).filter((s) => allowed.includes(s.kind));
  const options = [
    { value: NONE, label: !service ? 'Choose a service first' : signals.isPending ? 'Loading…' : `Choose a ${allowed.join(' or ')}` },
    ...fitting.map((s) => ({ value: s.name, label: `${s.name} (${s.kind})` })),
  ];
  // Keep a saved rule's signal on screen even before the list arrives.
  if (value && !fitting.some((s) => s.name === value)) options.push({ value, label: value });
  const hidden = (signals.data?.length ?? 0) - fitting.length;
  return (
    <SelectField
      label={label}
      accessibilityLabel={label}
      value={value}
      options={options}
      onChange={onChange}
      error={error}
      hint={hidden > 0 ? `${hidden} signal${hidden === 1 ? '' : 's'} of other kinds not listed: this rule reads a ${allowed.join(' or ')}.` : undefined}
      testID={testID}
    />
  );
}
