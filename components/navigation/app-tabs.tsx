import { Tabs } from 'expo-router';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { useTheme } from '../theme';
import { Icon } from '../ui/icon';
import { BottomBar } from './bottom-bar';
import { PLACES } from './places';
import { SideRail } from './side-rail';
import { TopBar } from './top-bar';

/** The signed-in app: bottom tabs and a top bar below 1024 px, a side rail from there up. */
export function AppTabs() {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  return (
    <Tabs
      tabBar={(props) => (isWide ? <SideRail {...props} /> : <BottomBar {...props} />)}
      screenOptions={{
        tabBarPosition: isWide ? 'left' : 'bottom',
        headerShown: !isWide,
        header: () => <TopBar />,
        sceneStyle: { backgroundColor: theme.colors.paper },
      }}
    >
      {PLACES.map((place) => (
        <Tabs.Screen
          key={place.name}
          name={place.name}
          options={{
            title: place.title,
            tabBarButtonTestID: place.testID,
            tabBarIcon: ({ color, size }) => <Icon name={place.icon} size={size} color={color} />,
          }}
        />
      ))}
    </Tabs>
  );
}
