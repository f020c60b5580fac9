import { Alert, Anchor, Button, Center, Paper, PasswordInput, Stack, Text, TextInput, Title } from '@mantine/core';
import { useForm } from '@mantine/form';
import { zod4Resolver } from 'mantine-form-zod-resolver';
import { useEffect, useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { acceptInviteSchema } from '@driftgrid/domain';
import { useAcceptInvite } from '../api/accounts.js';
import { ApiError } from '../api/client.js';
import { ctrlEnter } from '../components/AdminShared/ctrlEnter.js';
import { NameMark } from '../components/NameMark/NameMark.js';

type Values = { name: string; password: string; repeat: string };

const checkAccept = zod4Resolver(acceptInviteSchema);

/** Accept an invitation from the e-mail link (`/accept-invite?token=…`): choose a name and password, then signed in. */
export default function AcceptInvitePage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const navigate = useNavigate();
  const validate = (v: Values): Record<string, string> => {
    const errors = checkAccept({ token, name: v.name, password: v.password }) as Record<string, string>;
    // The token comes from the link, not a field: its problem is said in the alert below the fields.
    if (errors.token) errors.token = 'This invitation link is incomplete; open the link from the e-mail again.';
    if (v.password !== v.repeat) errors.repeat = 'does not match the password';
    return errors;
  };
  const form = useForm<Values>({
    mode: 'controlled',
    initialValues: { name: '', password: '', repeat: '' },
    validate,
    // Errors appear once a field was left or the form submitted, never before anything is typed.
    validateInputOnBlur: true,
  });
  const [formError, setFormError] = useState<string | null>(null);
  useEffect(() => {
    document.title = 'Accept invitation · Driftgrid';
  }, []);
  const accept = useAcceptInvite({
    onSuccess: () => {
      void navigate('/', { replace: true });
    },
    onError: (err) => {
      if (err instanceof ApiError && (err.detailFor('name') || err.detailFor('password'))) {
        form.setErrors({ name: err.detailFor('name'), password: err.detailFor('password') });
        setFormError(null);
      } else setFormError(err instanceof ApiError ? err.message : 'The invitation could not be accepted');
    },
  });
  // Validated: parse only applies the schema's trimming.
  const submit = form.onSubmit((v) => {
    setFormError(null);
    accept.mutate(acceptInviteSchema.parse({ token, name: v.name, password: v.password }));
  });
  const alert = formError ?? (typeof form.errors.token === 'string' ? form.errors.token : null);
  return (
    <Center mih="100vh" px="md">
      <Stack w="100%" maw={420} gap="lg">
        <Center>
          <NameMark size={40} />
        </Center>
        <Paper
          withBorder
          shadow="xs"
          p="lg"
          radius="md"
          component="form"
          onSubmit={submit}
          onKeyDown={ctrlEnter(() => submit())}
          noValidate
          aria-labelledby="accept-title"
        >
          <Stack gap="md">
            <div>
              <Title order={1} fz="h3" id="accept-title">
                Join Driftgrid
              </Title>
              <Text fz="sm" c="dimmed" mt={4}>
                Choose the name colleagues will see and a password. Your e-mail address is the one the invitation was
                sent to.
              </Text>
            </div>
            {!token ? (
              <Alert color="red">This page needs the link from your invitation e-mail (it ends in ?token=…).</Alert>
            ) : null}
            <TextInput label="Your name" {...form.getInputProps('name')} autoComplete="name" required />
            <PasswordInput
              label="Password"
              description="At least 10 characters."
              {...form.getInputProps('password')}
              autoComplete="new-password"
              required
            />
            <PasswordInput
              label="Password again"
              {...form.getInputProps('repeat')}
              autoComplete="new-password"
              required
            />
            {alert ? (
              <Alert color="red" role="alert">
                {alert}
              </Alert>
            ) : null}
            <Button type="submit" loading={accept.isPending} disabled={!token}>
              Create my account
            </Button>
            <Text fz="xs" c="dimmed">
              Already have an account?{' '}
              <Anchor component={Link} to="/sign-in">
                Sign in
              </Anchor>
              .
            </Text>
          </Stack>
        </Paper>
      </Stack>
    </Center>
  );
}
