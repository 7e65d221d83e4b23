import { ROLE_LABELS, type Role } from '../../shared/roles';
import { Notice } from '../ui/notice';

/** What a person sees where their role stops them, instead of controls that would fail. */
export function NotAllowed({ role, what }: { role: Role; what: string }) {
  return (
    <Notice tone="caution" title={`Your role (${ROLE_LABELS[role]}) cannot do this`} testID="not-allowed">
      {`${what} An admin can do it for you, or change your role.`}
    </Notice>
  );
}
