import { Alert, Button, Paper, PasswordInput, Stack, Text } from '@mantine/core';
import { useState, type FormEvent } from 'react';
import { changePasswordSchema } from '@driftgrid/domain';
import { ApiError } from '../api/client.js';
import { useChangePassword } from '../api/accounts.js';
import { ctrlEnter } from '../components/AdminShared/ctrlEnter.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { RevokeTokensOption } from '../components/RevokeTokensOption/RevokeTokensOption.js';

/** Change the password you sign in with (needs the current one). */
export default function PasswordPage() {
  const [current, setCurrent] = useState('');
  const [next, setNext] = useState('');
  const [repeat, setRepeat] = useState('');
  const [revokeTokens, setRevokeTokens] = useState(false);
  const [errors, setErrors] = useState<{ current?: string; next?: string; repeat?: string; form?: string }>({});
  const change = useChangePassword({
    onSuccess: () => {
      setCurrent('');
      setNext('');
      setRepeat('');
      setRevokeTokens(false);
    },
    onError: (err) => {
      if (err instanceof ApiError)
        setErrors({
          current: err.detailFor('current'),
          next: err.detailFor('next'),
          form: err.details.length ? undefined : err.message,
        });
      else setErrors({ form: 'The password could not be changed' });
    },
  });
  const submit = () => {
    const e: typeof errors = {};
    const parsed = changePasswordSchema.safeParse({ current, next, revokeTokens });
    if (!parsed.success) for (const i of parsed.error.issues) e[String(i.path[0]) as 'current' | 'next'] ??= i.message;
    if (next !== repeat) e.repeat = 'does not match the new password';
    setErrors(e);
    if (Object.keys(e).length || !parsed.success) return;
    change.mutate(parsed.data);
  };
  const onSubmit = (ev: FormEvent) => {
    ev.preventDefault();
    submit();
  };
  return (
    <>
      <PageHeader title="Password" description="Change the password you sign in with." />
      <Paper
        withBorder
        p="md"
        maw={460}
        component="form"
        onSubmit={onSubmit}
        onKeyDown={ctrlEnter(submit)}
        noValidate
        aria-label="Change password"
      >
        <Stack gap="sm">
          <PasswordInput
            label="Current password"
            value={current}
            onChange={(e) => setCurrent(e.currentTarget.value)}
            error={errors.current}
            autoComplete="current-password"
            required
          />
          <PasswordInput
            label="New password"
            description="At least 10 characters; a few unrelated words work well."
            value={next}
            onChange={(e) => setNext(e.currentTarget.value)}
            error={errors.next}
            autoComplete="new-password"
            required
          />
          <PasswordInput
            label="New password again"
            value={repeat}
            onChange={(e) => setRepeat(e.currentTarget.value)}
            error={errors.repeat}
            autoComplete="new-password"
            required
          />
          <RevokeTokensOption checked={revokeTokens} onChange={setRevokeTokens} />
          <Button type="submit" loading={change.isPending}>
            Change password
          </Button>
          <Text fz="xs" c="dimmed">
            Ctrl+Enter submits. Forgot it? Sign out and use “reset password” on the sign-in page.
          </Text>
          {errors.form ? <Alert color="red">{errors.form}</Alert> : null}
          {change.isSuccess ? <Alert color="green">{change.data.message}.</Alert> : null}
        </Stack>
      </Paper>
    </>
  );
}
