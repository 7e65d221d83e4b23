import { router, usePathname } from 'expo-router';
import { placeForRoute } from './places';
import type { TabBarProps } from './tab-bar-types';

/** Press handling shared by the bottom bar and the side rail. */
export function usePlacePress({ state, navigation }: Pick<TabBarProps, 'state' | 'navigation'>) {
  const pathname = usePathname();
  return (routeIndex: number) => {
    const route = state.routes[routeIndex];
    const isFocused = state.index === routeIndex;
    const event = navigation.emit({ type: 'tabPress', target: route.key, canPreventDefault: true });
    if (event.defaultPrevented) return;
    const place = placeForRoute(route.name);
    if (isFocused) {
      // Pressing the current place again returns to its first page (Settings → People → Settings).
      if (place && pathname !== place.path) router.navigate(place.href);
      return;
    }
    navigation.navigate(route.name, route.params);
  };
}
