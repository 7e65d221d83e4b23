import { useWindowDimensions } from 'react-native';

/** Named widths; everything responsive asks this hook rather than reading the window itself. */
export const BREAKPOINTS = {
  tablet: 768,
  wide: 1024,
  /** Wide with room to spare: a side column or a second pane beside full-width content. */
  roomy: 1280,
} as const;

export type Breakpoint = 'phone' | 'tablet' | 'wide';

export interface Breakpoints {
  width: number;
  height: number;
  breakpoint: Breakpoint;
  isPhone: boolean;
  isTablet: boolean;
  isWide: boolean;
  /** Tablet or wide: enough room for tables and side-by-side fields. */
  atLeastTablet: boolean;
  /** At least BREAKPOINTS.roomy: wide, with room for a side column as well. */
  isRoomy: boolean;
}

export function breakpointFor(width: number): Breakpoint {
  if (width >= BREAKPOINTS.wide) return 'wide';
  if (width >= BREAKPOINTS.tablet) return 'tablet';
  return 'phone';
}

export function useBreakpoints(): Breakpoints {
  const { width, height } = useWindowDimensions();
  const breakpoint = breakpointFor(width);
  return {
    width,
    height,
    breakpoint,
    isPhone: breakpoint === 'phone',
    isTablet: breakpoint === 'tablet',
    isWide: breakpoint === 'wide',
    atLeastTablet: breakpoint !== 'phone',
    isRoomy: width >= BREAKPOINTS.roomy,
  };
}
