import { View } from 'react-native';
import { useTheme } from '../theme';

export function Divider() {
  const theme = useTheme();
  return <View style={{ height: theme.borders.hairline, backgroundColor: theme.colors.line }} />;
}
