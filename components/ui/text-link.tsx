import { Link, type Href } from 'expo-router';
import { Text } from './text';
import type { TypeVariant } from '../theme';

/** An in-app link styled in the accent, underlined so it does not rely on colour. */
export function TextLink({
  href,
  label,
  variant = 'bodyStrong',
  testID,
}: {
  href: Href;
  label: string;
  variant?: TypeVariant;
  testID?: string;
}) {
  return (
    <Link href={href} testID={testID}>
      <Text variant={variant} tone="accent" style={{ textDecorationLine: 'underline' }}>
        {label}
      </Text>
    </Link>
  );
}
