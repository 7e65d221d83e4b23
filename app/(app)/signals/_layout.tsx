import { Slot } from 'expo-router';

// One page at a time; the explorer draws its own two panes on wide screens.
export default function SignalsLayout() {
  return <Slot />;
}
