import { Alert, Anchor, Button, Center, Paper, PasswordInput, Stack, Text, TextInput, Title } from '@mantine/core';
import { useEffect, useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { acceptInviteSchema } from '@driftgrid/domain';
import { useAcceptInvite } from '../api/accounts.js';
import { ApiError } from '../api/client.js';
import { ctrlEnter } from '../components/AdminShared/ctrlEnter.js';
import { NameMark } from '../components/NameMark/NameMark.js';

/** Accept an invitation from the e-mail link (`/accept-invite?token=…`): choose a name and password, then signed in. */
export default function AcceptInvitePage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [errors, setErrors] = useState<{ name?: string; password?: string; repeat?: string; form?: string }>({});
  useEffect(() => {
    document.title = 'Accept invitation · Driftgrid';
  }, []);
  const accept = useAcceptInvite({
    onSuccess: () => {
      void navigate('/', { replace: true });
    },
    onError: (err) => {
      if (err instanceof ApiError)
        setErrors({
          name: err.detailFor('name'),
          password: err.detailFor('password'),
          form: err.detailFor('name') || err.detailFor('password') ? undefined : err.message,
        });
      else setErrors({ form: 'The invitation could not be accepted' });
    },
  });
  const submit = () => {
    const parsed = acceptInviteSchema.safeParse({ token, name, password });
    const e: typeof errors = {};
    if (!parsed.success)
      for (const i of parsed.error.issues)
        (e as Record<string, string>)[String(i.path[0]) === 'token' ? 'form' : String(i.path[0])] ??=
          i.path[0] === 'token'
            ? 'This invitation link is incomplete; open the link from the e-mail again.'
            : i.message;
    if (password !== repeat) e.repeat = 'does not match the password';
    setErrors(e);
    if (Object.keys(e).length || !parsed.success) return;
    accept.mutate(parsed.data);
  };
  const onSubmit = (ev: FormEvent) => {
    ev.preventDefault();
    submit();
  };
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
          onSubmit={onSubmit}
          onKeyDown={ctrlEnter(submit)}
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
            <TextInput
              label="Your name"
              value={name}
              onChange={(e) => setName(e.currentTarget.value)}
              error={errors.name}
              autoComplete="name"
              required
            />
            <PasswordInput
              label="Password"
              description="At least 10 characters."
              value={password}
              onChange={(e) => setPassword(e.currentTarget.value)}
              error={errors.password}
              autoComplete="new-password"
              required
            />
            <PasswordInput
              label="Password again"
              value={repeat}
              onChange={(e) => setRepeat(e.currentTarget.value)}
              error={errors.repeat}
              autoComplete="new-password"
              required
            />
            {errors.form ? (
              <Alert color="red" role="alert">
                {errors.form}
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
