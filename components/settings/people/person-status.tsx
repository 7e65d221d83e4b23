import { StatusMark } from '../../ui/status-mark';

export function PersonStatus({ disabled }: { disabled: boolean }) {
  return disabled ? <StatusMark tone="off" label="Disabled" /> : <StatusMark tone="good" label="Active" />;
}
