import { View } from 'react-native';
import { useServicesQuery } from '../../../hooks/queries/services';
import { Checkbox } from '../../forms/checkbox';
import { FieldMessage } from '../../forms/field-message';
import { useTheme } from '../../theme';
import { Card } from '../../ui/card';
import { Text } from '../../ui/text';

/**
 * The internal services this journey exercises (release watches and findings use it). Shown only
 * when the services list answers.
 */
export function ServicesPicker({ chosen, onChange, error }: { chosen: number[]; onChange: (next: number[]) => void; error?: string }) {
  const theme = useTheme();
  const services = useServicesQuery();
  if (!services.data) return null;
  return (
    <Card title="Services exercised" description="Which of your services this journey walks through. Release watches compare the journeys of a released service." testID="journey-services">
      <View style={{ gap: theme.space.xs }}>
        {services.data.length === 0 ? (
          <Text variant="small" tone="muted">
            No services yet. They appear once a service sends its metrics.
          </Text>
        ) : (
          services.data.map((s) => (
            <Checkbox
              key={s.id}
              label={s.name}
              detail={s.description || undefined}
              checked={chosen.includes(s.id)}
              onChange={(on) => onChange(on ? [...chosen, s.id] : chosen.filter((id) => id !== s.id))}
              testID={`journey-service-${s.name}`}
            />
          ))
        )}
        <FieldMessage error={error} />
      </View>
    </Card>
  );
}
