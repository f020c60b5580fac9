import { Alert, Anchor, Button, Center, Paper, PasswordInput, Stack, Text, TextInput, Title } from '@mantine/core';
import { useForm } from '@mantine/form';
import { zod4Resolver } from 'mantine-form-zod-resolver';
import { useEffect, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { passwordResetConfirmSchema, passwordResetRequestSchema } from '@driftgrid/domain';
import { useConfirmPasswordReset, useRequestPasswordReset } from '../api/accounts.js';
import { ApiError } from '../api/client.js';
import { ctrlEnter } from '../components/AdminShared/ctrlEnter.js';
import { NameMark } from '../components/NameMark/NameMark.js';

const checkRequest = zod4Resolver(passwordResetRequestSchema);
const checkConfirm = zod4Resolver(passwordResetConfirmSchema);

// Errors appear once a field was left or the form submitted, never before anything is typed.
const SHOW_AFTER_TOUCH = { mode: 'controlled', validateInputOnBlur: true } as const;

function RequestForm() {
  const form = useForm<{ email: string }>({
    ...SHOW_AFTER_TOUCH,
    initialValues: { email: '' },
    validate: (v) => checkRequest(v) as Record<string, string>,
  });
  const request = useRequestPasswordReset({
    onError: (err) =>
      form.setFieldError(
        'email',
        err instanceof ApiError ? (err.detailFor('email') ?? err.message) : 'The request could not be sent',
      ),
  });
  // Validated: parse only applies the schema's trimming and lower-casing.
  const submit = form.onSubmit((v) => request.mutate(passwordResetRequestSchema.parse(v)));
  return (
    <form onSubmit={submit} onKeyDown={ctrlEnter(() => submit())} noValidate aria-label="Ask for a reset link">
      <Stack gap="md">
        <Text fz="sm" c="dimmed">
          Enter the e-mail address of your account. We send a link that lets you choose a new password; it works once,
          for one hour.
        </Text>
        <TextInput label="E-mail address" {...form.getInputProps('email')} autoComplete="email" required />
        {request.isSuccess ? <Alert color="green">{request.data.message}</Alert> : null}
        <Button type="submit" loading={request.isPending}>
          Send the reset link
        </Button>
      </Stack>
    </form>
  );
}

type ConfirmValues = { password: string; repeat: string };

function ConfirmForm({ token }: { token: string }) {
  /** The domain's confirm schema (token + password), plus the repeat field only this form has. */
  const validate = (v: ConfirmValues): Record<string, string> => {
    const errors = checkConfirm({ token, password: v.password }) as Record<string, string>;
    // The token comes from the link, not a field: its problem is said in the alert below the fields.
    if (errors.token) errors.token = 'This reset link is incomplete; open the link from the e-mail again.';
    if (v.password !== v.repeat) errors.repeat = 'does not match the new password';
    return errors;
  };
  const form = useForm<ConfirmValues>({ ...SHOW_AFTER_TOUCH, initialValues: { password: '', repeat: '' }, validate });
  const [formError, setFormError] = useState<string | null>(null);
  const confirm = useConfirmPasswordReset({
    onError: (err) => {
      if (err instanceof ApiError && err.detailFor('password')) {
        form.setFieldError('password', err.detailFor('password'));
        setFormError(null);
      } else setFormError(err instanceof ApiError ? err.message : 'The password could not be changed');
    },
  });
  const submit = form.onSubmit((v) => {
    setFormError(null);
    confirm.mutate(passwordResetConfirmSchema.parse({ token, password: v.password }));
  });
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
  const alert = formError ?? (typeof form.errors.token === 'string' ? form.errors.token : null);
  return (
    <form onSubmit={submit} onKeyDown={ctrlEnter(() => submit())} noValidate aria-label="Choose a new password">
      <Stack gap="md">
        <PasswordInput
          label="New password"
          description="At least 10 characters."
          {...form.getInputProps('password')}
          autoComplete="new-password"
          required
        />
        <PasswordInput
          label="New password again"
          {...form.getInputProps('repeat')}
          autoComplete="new-password"
          required
        />
        {alert ? (
          <Alert color="red" role="alert">
            {alert}{' '}
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
