import { lazy, Suspense, type ComponentProps, type ComponentType } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { Loading } from '../ui/loading';

type Screens = typeof import('./signals-screens');

const loadScreens = () => import('./signals-screens');

function ScreenLoading() {
  const theme = useTheme();
  return (
    <View style={{ flex: 1, backgroundColor: theme.colors.paper, padding: theme.space.xl }}>
      <Loading label="Opening Signals…" />
    </View>
  );
}

function lazyScreen<K extends keyof Screens>(name: K): ComponentType<ComponentProps<Screens[K]>> {
  const Lazy = lazy(async () => ({ default: (await loadScreens())[name] as ComponentType<object> }));
  function LazyScreen(props: ComponentProps<Screens[K]>) {
    return (
      <Suspense fallback={<ScreenLoading />}>
        <Lazy {...(props as object)} />
      </Suspense>
    );
  }
  LazyScreen.displayName = `Lazy(${name})`;
  return LazyScreen;
}

// The screens the routes render; each loads the Signals chunk the first time one is shown.
export const ServicesScreen = lazyScreen('ServicesScreen');
export const SignalExplorerScreen = lazyScreen('SignalExplorerScreen');
export const CsvUploadScreen = lazyScreen('CsvUploadScreen');
export const CollectionTargetsScreen = lazyScreen('CollectionTargetsScreen');
