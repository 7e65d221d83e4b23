import { createContext, useContext, useMemo, type ReactNode } from 'react';
import { useColorScheme } from 'react-native';
import { darkPalette, lightPalette, type Palette } from './colors';
import { borders, chart, fonts, radii, sizes, space, type } from './tokens';

export interface Theme {
  scheme: 'light' | 'dark';
  colors: Palette;
  space: typeof space;
  radii: typeof radii;
  borders: typeof borders;
  sizes: typeof sizes;
  chart: typeof chart;
  fonts: typeof fonts;
  type: typeof type;
}

function makeTheme(scheme: 'light' | 'dark'): Theme {
  return {
    scheme,
    colors: scheme === 'dark' ? darkPalette : lightPalette,
    space,
    radii,
    borders,
    sizes,
    chart,
    fonts,
    type,
  };
}

const ThemeContext = createContext<Theme>(makeTheme('light'));

/** Follows the system's light/dark preference. */
export function ThemeProvider({ children }: { children: ReactNode }) {
  const system = useColorScheme();
  const scheme = system === 'dark' ? 'dark' : 'light';
  const theme = useMemo(() => makeTheme(scheme), [scheme]);
  return <ThemeContext.Provider value={theme}>{children}</ThemeContext.Provider>;
}

export function useTheme(): Theme {
  return useContext(ThemeContext);
}
