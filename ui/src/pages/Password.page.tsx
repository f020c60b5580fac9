import { Alert, Button, Paper, PasswordInput, Stack, Text } from '@mantine/core';
import { useForm } from '@mantine/form';
import { zod4Resolver } from 'mantine-form-zod-resolver';
import { useState } from 'react';
import { changePasswordSchema } from '@driftgrid/domain';
import { ApiError } from '../api/client.js';
import { useChangePassword } from '../api/accounts.js';
import { ctrlEnter } from '../components/AdminShared/ctrlEnter.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { RevokeTokensOption } from '../components/RevokeTokensOption/RevokeTokensOption.js';

type Values = { current: string; next: string; repeat: string; revokeTokens: boolean };

const checkRequest = zod4Resolver(changePasswordSchema);

/** The domain's request schema, plus the repeat field only this form has; errors keyed by field. */
function validate(v: Values): Record<string, string> {
  const errors = checkRequest({ current: v.current, next: v.next, revokeTokens: v.revokeTokens }) as Record<
    string,
    string
  >;
  if (v.next !== v.repeat) errors.repeat = 'does not match the new password';
  return errors;
}

/** Change the password you sign in with (needs the current one). */
export default function PasswordPage() {
  const form = useForm<Values>({
    mode: 'controlled',
    initialValues: { current: '', next: '', repeat: '', revokeTokens: false },
    validate,
    // Errors appear once a field was left or the form submitted, never before anything is typed.
    validateInputOnBlur: true,
  });
  const [formError, setFormError] = useState<string | null>(null);
  const change = useChangePassword({
    onSuccess: () => form.reset(),
    onError: (err) => {
      if (err instanceof ApiError && err.details.length) {
        form.setErrors({ current: err.detailFor('current'), next: err.detailFor('next') });
        setFormError(null);
      } else setFormError(err instanceof ApiError ? err.message : 'The password could not be changed');
    },
  });
  const submit = form.onSubmit((v) => {
    setFormError(null);
    change.mutate({ current: v.current, next: v.next, revokeTokens: v.revokeTokens });
  });
  return (
    <>
      <PageHeader title="Password" description="Change the password you sign in with." />
      <Paper
        withBorder
        p="md"
        maw={460}
        component="form"
        onSubmit={submit}
        onKeyDown={ctrlEnter(() => submit())}
        noValidate
        aria-label="Change password"
      >
        <Stack gap="sm">
          <PasswordInput
            label="Current password"
            {...form.getInputProps('current')}
            autoComplete="current-password"
            required
          />
          <PasswordInput
            label="New password"
            description="At least 10 characters; a few unrelated words work well."
            {...form.getInputProps('next')}
            autoComplete="new-password"
            required
          />
          <PasswordInput
            label="New password again"
            {...form.getInputProps('repeat')}
            autoComplete="new-password"
            required
          />
          <RevokeTokensOption
            checked={form.values.revokeTokens}
            onChange={(v) => form.setFieldValue('revokeTokens', v)}
          />
          <Button type="submit" loading={change.isPending}>
            Change password
          </Button>
          <Text fz="xs" c="dimmed">
            Ctrl+Enter submits. Forgot it? Sign out and use “reset password” on the sign-in page.
          </Text>
          {formError ? <Alert color="red">{formError}</Alert> : null}
          {change.isSuccess ? <Alert color="green">{change.data.message}.</Alert> : null}
        </Stack>
      </Paper>
    </>
  );
}
