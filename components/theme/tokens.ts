import { Platform, type TextStyle } from 'react-native';

// Spacing on a 4-point grid; components use these names, never raw numbers.
export const space = {
  none: 0,
  xxs: 2,
  xs: 4,
  sm: 8,
  md: 12,
  lg: 16,
  xl: 24,
  xxl: 32,
  xxxl: 48,
  huge: 64,
} as const;
export type Space = keyof typeof space;

export const radii = {
  sm: 4,
  md: 8,
  lg: 12,
  pill: 999,
} as const;

export const borders = {
  hairline: 1,
  strong: 2,
} as const;

// Fixed sizes of layout pieces, kept here so screens share them.
export const sizes = {
  railWidth: 232,
  tabBarHeight: 60,
  topBarHeight: 52,
  contentMax: 1120,
  readingMax: 720,
  formMax: 440,
  settingsListWidth: 216,
  touchTarget: 44,
  iconSm: 16,
  icon: 20,
  iconLg: 24,
  mark: 10,
  markSmall: 9,
  /** Lines a mark up with the first line of body text beside it. */
  markOffsetBody: 7,
  markOffsetSmall: 6,
  accentEdge: 3,
  indicator: 3,
  checkbox: 22,
  compactControl: 36,
  stepBadge: 32,
  ordinalColumn: 20,
  factLabel: 64,
  statusRow: 24,
  /** Journeys: the list beside a journey's detail on wide screens. */
  journeyPaneWidth: 296,
  /** Editor: the side column (cautions, "Try it now") on wide screens. */
  editorAsideWidth: 400,
  chartHeight: 240,
  chartLegendLine: 24,
  /** Waterfall: phase names on the left, durations on the right, bars between. */
  waterfallLabel: 76,
  waterfallValue: 64,
  waterfallBar: 10,
  /** Columns and fields that hold a short figure. */
  figureColumn: 96,
  /** Side-by-side fields wrap below this width. */
  fieldMin: 160,
  orderButton: 36,
} as const;

// Chart drawing: line weights, marker sizes and one dash pattern per series (the patterns cycle
// with the colours, so two steps never share both). The RN legend mirrors them with borderStyle.
export const chart = {
  lineWidth: 2,
  axisFont: 11,
  dotRadius: 3.5,
  failRadius: 6,
  voidRadius: 5,
  dashes: [null, [7, 4], [2, 3]] as const,
  legendStyles: ['solid', 'dashed', 'dotted'] as const,
  padding: { left: 4, right: 12, top: 12, bottom: 4 },
  /** Room inside the plot so the first and last runs are not drawn on the frame. */
  domainPadding: { left: 8, right: 8 },
  voidDash: [3, 2],
} as const;

// Font family names registered by useFonts in the root layout. On the web a CSS fallback
// stack lets the first render use system fonts until the shipped files arrive.
const webFallbackSans = ', system-ui, -apple-system, "Segoe UI", sans-serif';
const webFallbackMono = ', ui-monospace, "SFMono-Regular", Menlo, monospace';
function family(name: string, fallback: string): string {
  return Platform.OS === 'web' ? `${name}${fallback}` : name;
}

export const fontFiles = {
  sans: 'AtkinsonHyperlegible_400Regular',
  sansBold: 'AtkinsonHyperlegible_700Bold',
  mono: 'IBMPlexMono_400Regular',
  monoMedium: 'IBMPlexMono_500Medium',
} as const;

export const fonts = {
  sans: family(fontFiles.sans, webFallbackSans),
  sansBold: family(fontFiles.sansBold, webFallbackSans),
  mono: family(fontFiles.mono, webFallbackMono),
  monoMedium: family(fontFiles.monoMedium, webFallbackMono),
} as const;

// Type scale. Bold comes from the bold file, not synthetic weight.
export const type = {
  display: { fontFamily: fonts.sansBold, fontSize: 30, lineHeight: 38 },
  title: { fontFamily: fonts.sansBold, fontSize: 22, lineHeight: 30 },
  heading: { fontFamily: fonts.sansBold, fontSize: 17, lineHeight: 24 },
  body: { fontFamily: fonts.sans, fontSize: 16, lineHeight: 24 },
  bodyStrong: { fontFamily: fonts.sansBold, fontSize: 16, lineHeight: 24 },
  small: { fontFamily: fonts.sans, fontSize: 14, lineHeight: 20 },
  smallStrong: { fontFamily: fonts.sansBold, fontSize: 14, lineHeight: 20 },
  label: { fontFamily: fonts.sansBold, fontSize: 13, lineHeight: 18, letterSpacing: 0.2 },
  caption: { fontFamily: fonts.sans, fontSize: 12, lineHeight: 16 },
  tab: { fontFamily: fonts.sansBold, fontSize: 11, lineHeight: 14 },
  number: { fontFamily: fonts.mono, fontSize: 15, lineHeight: 22 },
  numberSmall: { fontFamily: fonts.mono, fontSize: 13, lineHeight: 18 },
  numberLarge: { fontFamily: fonts.monoMedium, fontSize: 28, lineHeight: 36 },
  code: { fontFamily: fonts.mono, fontSize: 14, lineHeight: 20 },
} satisfies Record<string, TextStyle>;
export type TypeVariant = keyof typeof type;
