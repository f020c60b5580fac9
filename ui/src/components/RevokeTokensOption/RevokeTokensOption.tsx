import { Checkbox, Text } from '@mantine/core';
import { useActiveTokenCount } from '../../api/tokens.js';

export interface RevokeTokensOptionProps {
  checked: boolean;
  onChange: (checked: boolean) => void;
}

/**
 * The password form's offer to revoke the personal API tokens too, with how many are active.
 * Kept apart from the form so the form can change without touching it.
 */
export function RevokeTokensOption({ checked, onChange }: RevokeTokensOptionProps) {
  const active = useActiveTokenCount();
  const n = active.data?.count;
  if (n === undefined) return null;
  if (n === 0)
    return (
      <Text fz="sm" c="dimmed" data-testid="revoke-tokens-none">
        You have no active API tokens.
      </Text>
    );
  return (
    <Checkbox
      checked={checked}
      onChange={(e) => onChange(e.currentTarget.checked)}
      label={`Also revoke my ${n} active API token${n === 1 ? '' : 's'}`}
      description="Do this if someone else may know your password or a token. Scripts using them stop working until you create new ones."
    />
  );
}
