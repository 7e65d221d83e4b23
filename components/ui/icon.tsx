import Feather from '@expo/vector-icons/Feather';
import type { ComponentProps } from 'react';

export type IconName = ComponentProps<typeof Feather>['name'];

/** One icon family for the whole app (its font is preloaded by the root providers). */
export function Icon({ name, size, color }: { name: IconName; size: number; color: string }) {
  return <Feather name={name} size={size} color={color} accessibilityElementsHidden importantForAccessibility="no" />;
}

export const iconFont = Feather.font;
