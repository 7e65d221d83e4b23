// Screens that load with their own chunk the first time one is shown, so a place's code stays out
// of the first-load bundle. Each place passes its own `() => import('./screens')`: the bundler
// splits at that literal import.
import { lazy, Suspense, type ComponentProps, type ComponentType } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { Loading } from './loading';

function ScreenLoading({ label }: { label: string }) {
  const theme = useTheme();
  return (
    <View style={{ flex: 1, backgroundColor: theme.colors.paper, padding: theme.space.xl }}>
      <Loading label={label} />
    </View>
  );
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type AnyScreen = ComponentType<any>;

export function lazyScreens<Screens extends { [name: string]: unknown }>(load: () => Promise<Screens>, loadingLabel: string) {
  return function lazyScreen<K extends { [N in keyof Screens]: Screens[N] extends AnyScreen ? N : never }[keyof Screens] & string>(
    name: K,
  ): ComponentType<ComponentProps<Screens[K] & AnyScreen>> {
    const Lazy = lazy(async () => ({ default: (await load())[name] as ComponentType<object> }));
    function LazyScreen(props: ComponentProps<Screens[K] & AnyScreen>) {
      return (
        <Suspense fallback={<ScreenLoading label={loadingLabel} />}>
          <Lazy {...(props as object)} />
        </Suspense>
      );
    }
    LazyScreen.displayName = `Lazy(${name})`;
    return LazyScreen;
  };
}
