import { useState } from 'react';
import { View } from 'react-native';
import { useUpdateUserMutation } from '../../../hooks/queries/users';
import type { Role } from '../../../shared/roles';
import { ROLE_LABELS } from '../../../shared/roles';
import type { UserView } from '../../../shared/schemas/users';
import { describeError } from '../../format/describe-error';
import { formatRelative } from '../../format/time';
import { SelectField } from '../../forms/select-field';
import { FieldMessage } from '../../forms/field-message';
import { useTheme } from '../../theme';
import { Button } from '../../ui/button';
import { Text } from '../../ui/text';
import { PersonStatus } from './person-status';
import { ROLE_OPTIONS } from './role-options';
import { PEOPLE_COLUMNS } from './people-columns';

export interface PersonRowProps {
  person: UserView;
  isSelf: boolean;
  viewerRole: Role;
  layout: 'table' | 'card';
}

/** One person, with the admin's controls; each row keeps its own pending state and error. */
export function PersonRow({ person, isSelf, viewerRole, layout }: PersonRowProps) {
  const theme = useTheme();
  const update = useUpdateUserMutation();
  const [confirming, setConfirming] = useState(false);

  const role = isSelf ? (
    <Text variant="body">{ROLE_LABELS[person.role]}</Text>
  ) : (
    <SelectField
      accessibilityLabel={`Role of ${person.name}`}
      value={person.role}
      options={ROLE_OPTIONS}
      disabled={update.isPending}
      onChange={(next) => update.mutate({ id: person.id, role: next })}
      testID={`people-role-${person.email}`}
      compact
    />
  );

  const lastSignIn = (
    <Text variant="numberSmall" tone="muted">
      {person.lastSignInAt ? formatRelative(person.lastSignInAt) : 'never'}
    </Text>
  );

  const actions = isSelf ? (
    <Text variant="small" tone="faint">
      This is you
    </Text>
  ) : confirming ? (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm, justifyContent: layout === 'table' ? 'flex-end' : 'flex-start' }}>
      <Button
        label="Disable"
        kind="danger"
        compact
        busy={update.isPending}
        onPress={() => update.mutate({ id: person.id, disabled: true }, { onSettled: () => setConfirming(false) })}
        testID={`people-disable-confirm-${person.email}`}
      />
      <Button label="Keep" kind="quiet" compact onPress={() => setConfirming(false)} testID={`people-disable-cancel-${person.email}`} />
    </View>
  ) : person.disabled ? (
    <Button
      label="Enable"
      compact
      busy={update.isPending}
      onPress={() => update.mutate({ id: person.id, disabled: false })}
      testID={`people-toggle-${person.email}`}
    />
  ) : (
    <Button label="Disable" compact onPress={() => setConfirming(true)} testID={`people-toggle-${person.email}`} />
  );

  const problem = update.isError ? <FieldMessage error={describeError(update.error, viewerRole)} /> : null;
  const confirmLine = confirming ? (
    <Text variant="small" tone="muted">
      {`Disable ${person.name}? They can no longer sign in; their history stays.`}
    </Text>
  ) : null;

  if (layout === 'card') {
    return (
      <View testID={`people-row-${person.email}`} style={{ paddingVertical: theme.space.lg, gap: theme.space.md }}>
        <View style={{ flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: theme.space.md }}>
          <View style={{ flex: 1 }}>
            <Text variant="bodyStrong">{person.name}</Text>
            <Text variant="small" tone="muted">
              {person.email}
            </Text>
          </View>
          <PersonStatus disabled={person.disabled} />
        </View>
        {role}
        <Text variant="small" tone="muted">
          Last signed in {lastSignIn}
        </Text>
        {confirmLine}
        {actions}
        {problem}
      </View>
    );
  }

  return (
    <View testID={`people-row-${person.email}`} style={{ paddingVertical: theme.space.md, paddingHorizontal: theme.space.xl, gap: theme.space.sm }}>
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.lg }}>
        <View style={PEOPLE_COLUMNS.person}>
          <Text variant="bodyStrong" numberOfLines={1}>
            {person.name}
          </Text>
          <Text variant="small" tone="muted" numberOfLines={1}>
            {person.email}
          </Text>
        </View>
        <View style={PEOPLE_COLUMNS.role}>{role}</View>
        <View style={PEOPLE_COLUMNS.status}>
          <PersonStatus disabled={person.disabled} />
        </View>
        <View style={PEOPLE_COLUMNS.lastSignIn}>{lastSignIn}</View>
        <View style={PEOPLE_COLUMNS.actions}>{actions}</View>
      </View>
      {confirmLine || problem ? (
        <View style={{ alignItems: 'flex-end', gap: theme.space.xs }}>
          {confirmLine}
          {problem}
        </View>
      ) : null}
    </View>
  );
}
