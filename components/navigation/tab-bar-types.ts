import type { ComponentProps } from 'react';
import type { Tabs } from 'expo-router';

/** The props the tab navigator hands to a custom tab bar (kept off the transitive package's import). */
export type TabBarProps = Parameters<NonNullable<ComponentProps<typeof Tabs>['tabBar']>>[0];
