import { Slot } from 'expo-router';

// One page at a time; the Alerts list and the rule editor draw their own two panes on wide screens.
export default function AlertsLayout() {
  return <Slot />;
}
