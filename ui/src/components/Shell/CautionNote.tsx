import { Text } from '@mantine/core';

/** SPEC §11 in short; shown in the shell footer and under the sign-in form. */
export const CAUTION_TEXT =
  'Results come from reduced fluid models with stated validity limits; work on real plasma devices follows local codes and licensed practice.';

export function CautionNote({ ta = 'center' }: { ta?: 'center' | 'left' }) {
  return (
    <Text fz="xs" c="dimmed" ta={ta} data-testid="caution">
      {CAUTION_TEXT}
    </Text>
  );
}
