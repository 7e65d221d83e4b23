export { ThemeProvider, useTheme, type Theme } from './use-theme';
export { lightPalette, darkPalette, type Palette } from './colors';
export { space, radii, borders, sizes, chart, fonts, fontFiles, type, type Space, type TypeVariant } from './tokens';
