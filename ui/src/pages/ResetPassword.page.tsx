import { Alert, Anchor, Button, Center, Paper, PasswordInput, Stack, Text, TextInput, Title } from '@mantine/core';
import { useEffect, useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { passwordResetConfirmSchema, passwordResetRequestSchema } from '@driftgrid/domain';
import { useConfirmPasswordReset, useRequestPasswordReset } from '../api/accounts.js';
import { ApiError } from '../api/client.js';
import { ctrlEnter } from '../components/AdminShared/ctrlEnter.js';
import { NameMark } from '../components/NameMark/NameMark.js';

function RequestForm() {
  const [email, setEmail] = useState('');
  const [error, setError] = useState<string | undefined>();
  const request = useRequestPasswordReset({
    onError: (err) =>
      setError(err instanceof ApiError ? (err.detailFor('email') ?? err.message) : 'The request could not be sent'),
  });
  const submit = () => {
    const parsed = passwordResetRequestSchema.safeParse({ email });
    if (!parsed.success) return setError(parsed.error.issues[0]?.message);
    setError(undefined);
    request.mutate(parsed.data);
  };
  return (
    <form
      onSubmit={(e: FormEvent) => {
        e.preventDefault();
        submit();
      }}
      onKeyDown={ctrlEnter(submit)}
      noValidate
      aria-label="Ask for a reset link"
    >
      <Stack gap="md">
        <Text fz="sm" c="dimmed">
          Enter the e-mail address of your account. We send a link that lets you choose a new password; it works once,
          for one hour.
        </Text>
        <TextInput
          label="E-mail address"
          value={email}
          onChange={(e) => setEmail(e.currentTarget.value)}
          error={error}
          autoComplete="email"
          required
        />
        {request.isSuccess ? <Alert color="green">{request.data.message}</Alert> : null}
        <Button type="submit" loading={request.isPending}>
          Send the reset link
        </Button>
      </Stack>
    </form>
  );
}

function ConfirmForm({ token }: { token: string }) {
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [errors, setErrors] = useState<{ password?: string; repeat?: string; form?: string }>({});
  const confirm = useConfirmPasswordReset({
    onError: (err) => {
      if (err instanceof ApiError)
        setErrors({ password: err.detailFor('password'), form: err.detailFor('password') ? undefined : err.message });
      else setErrors({ form: 'The password could not be changed' });
    },
  });
  const submit = () => {
    const parsed = passwordResetConfirmSchema.safeParse({ token, password });
    const e: typeof errors = {};
    if (!parsed.success)
      for (const i of parsed.error.issues)
        (e as Record<string, string>)[i.path[0] === 'token' ? 'form' : 'password'] ??=
          i.path[0] === 'token' ? 'This reset link is incomplete; open the link from the e-mail again.' : i.message;
    if (password !== repeat) e.repeat = 'does not match the new password';
    setErrors(e);
    if (Object.keys(e).length || !parsed.success) return;
    confirm.mutate(parsed.data);
  };
  if (confirm.isSuccess) {
    return (
      <Stack gap="md">
        <Alert color="green">{confirm.data.message}.</Alert>
        <Button component={Link} to="/sign-in">
          Go to sign-in
        </Button>
      </Stack>
    );
  }
  return (
    <form
      onSubmit={(e: FormEvent) => {
        e.preventDefault();
        submit();
      }}
      onKeyDown={ctrlEnter(submit)}
      noValidate
      aria-label="Choose a new password"
    >
      <Stack gap="md">
        <PasswordInput
          label="New password"
          description="At least 10 characters."
          value={password}
          onChange={(e) => setPassword(e.currentTarget.value)}
          error={errors.password}
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
        {errors.form ? (
          <Alert color="red" role="alert">
            {errors.form}{' '}
            <Anchor component={Link} to="/reset-password">
              Ask for a new link
            </Anchor>
            .
          </Alert>
        ) : null}
        <Button type="submit" loading={confirm.isPending}>
          Set the new password
        </Button>
      </Stack>
    </form>
  );
}

/** `/reset-password`: ask for a link; `/reset-password?token=…` (the e-mailed link): choose the new password. */
export default function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token');
  useEffect(() => {
    document.title = 'Reset password · Driftgrid';
  }, []);
  return (
    <Center mih="100vh" px="md">
      <Stack w="100%" maw={420} gap="lg">
        <Center>
          <NameMark size={40} />
        </Center>
        <Paper withBorder shadow="xs" p="lg" radius="md" component="section" aria-labelledby="reset-title">
          <Title order={1} fz="h3" id="reset-title" mb="sm">
            {token ? 'Choose a new password' : 'Reset your password'}
          </Title>
          {token ? <ConfirmForm token={token} /> : <RequestForm />}
          <Text fz="xs" c="dimmed" mt="md">
            <Anchor component={Link} to="/sign-in">
              Back to sign-in
            </Anchor>
          </Text>
        </Paper>
      </Stack>
    </Center>
  );
}
