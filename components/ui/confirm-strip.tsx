import { View } from 'react-native';
import { useTheme } from '../theme';
import { Button } from './button';
import { Text } from './text';

/** The second step of a destructive action: what will happen, then do it or keep things as they are. */
export function ConfirmStrip(props: {
  question: string;
  confirmLabel: string;
  busy: boolean;
  onConfirm: () => void;
  onCancel: () => void;
  confirmTestID: string;
  cancelTestID: string;
}) {
  const theme = useTheme();
  return (
    <View style={{ gap: theme.space.sm }}>
      <Text variant="small">{props.question}</Text>
      <View style={{ flexDirection: 'row', gap: theme.space.sm }}>
        <Button label={props.confirmLabel} kind="danger" compact busy={props.busy} onPress={props.onConfirm} testID={props.confirmTestID} />
        <Button label="Keep it" kind="quiet" compact onPress={props.onCancel} testID={props.cancelTestID} />
      </View>
    </View>
  );
}
