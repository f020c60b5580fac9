import {
  Alert,
  Anchor,
  Box,
  Button,
  Center,
  Group,
  Paper,
  PasswordInput,
  Stack,
  Text,
  TextInput,
  Title,
} from '@mantine/core';
import { useForm } from '@mantine/form';
import { IconAlertCircle, IconClock } from '@tabler/icons-react';
import { zod4Resolver } from 'mantine-form-zod-resolver';
import { useEffect, useState } from 'react';
import { loginRequestSchema } from '@driftgrid/domain';
import { Link, Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { useLogin } from '../api/auth.js';
import { ApiError } from '../api/client.js';
import { safeNext } from '../auth/RequireAuth.js';
import { resetSessionExpired, sessionExpired, useSession } from '../auth/session.js';
import { NameMark } from '../components/NameMark/NameMark.js';
import { CautionNote } from '../components/Shell/CautionNote.js';
import { ColorSchemeToggle } from '../components/Shell/ColorSchemeToggle.js';

type Values = { email: string; password: string };

const checkRequest = zod4Resolver(loginRequestSchema);

/** The domain's login schema; an empty field is named in the user's words rather than as "required". */
function validate(v: Values): Record<string, string> {
  const errors = checkRequest(v) as Record<string, string>;
  if (!v.email.trim()) errors.email = 'Enter the email address your account uses';
  if (!v.password) errors.password = 'Enter your password';
  return errors;
}

function messageOf(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  return 'Sign-in failed for an unexpected reason. Try again.';
}

export default function SignInPage() {
  const [params] = useSearchParams();
  const next = safeNext(params.get('next'));
  const navigate = useNavigate();
  const session = useSession();
  const loginMutation = useLogin();
  const form = useForm<Values>({
    mode: 'controlled',
    initialValues: { email: '', password: '' },
    validate,
    // Errors appear once a field was left or the form submitted, never before anything is typed.
    validateInputOnBlur: true,
  });
  const [expired] = useState(sessionExpired);

  useEffect(() => {
    document.title = 'Sign in · Driftgrid';
  }, []);

  // Already signed in (another tab, or the back button): go where the user was heading.
  if (session && !loginMutation.isPending && !loginMutation.isSuccess) return <Navigate to={next} replace />;

  const onSubmit = form.onSubmit((v) => {
    loginMutation.mutate(
      { email: v.email.trim(), password: v.password },
      {
        onSuccess: () => {
          resetSessionExpired();
          void navigate(next, { replace: true });
        },
      },
    );
  });

  return (
    <Box mih="100vh" style={{ display: 'flex', flexDirection: 'column' }}>
      <Group justify="flex-end" p="md">
        <ColorSchemeToggle />
      </Group>
      <Center style={{ flex: 1 }} px="md">
        <Stack w="100%" maw={380} gap="lg">
          <Center>
            <NameMark size={40} />
          </Center>
          <Paper withBorder shadow="xs" p="lg" radius="md" component="section" aria-labelledby="signin-title">
            <form onSubmit={onSubmit} noValidate>
              <Stack gap="md">
                <div>
                  <Title order={1} fz="h3" id="signin-title">
                    Welcome to Driftgrid
                  </Title>
                  <Text fz="sm" c="dimmed" mt={4}>
                    Use the email address and password your administrator gave you.
                  </Text>
                </div>
                {expired && !loginMutation.isError ? (
                  <Alert
                    color="iris"
                    variant="light"
                    icon={<IconClock size={18} aria-hidden />}
                    data-testid="session-expired"
                  >
                    Your session ended. Sign in again to return to the page you were on; unsaved form input is kept.
                  </Alert>
                ) : null}
                {loginMutation.isError ? (
                  <Alert
                    color="rust"
                    variant="light"
                    role="alert"
                    data-testid="signin-error"
                    icon={<IconAlertCircle size={18} aria-hidden />}
                  >
                    {messageOf(loginMutation.error)}
                  </Alert>
                ) : null}
                <TextInput
                  label="Email"
                  type="email"
                  name="email"
                  autoComplete="username"
                  autoFocus
                  {...form.getInputProps('email')}
                />
                <PasswordInput
                  label="Password"
                  name="password"
                  autoComplete="current-password"
                  {...form.getInputProps('password')}
                  visibilityToggleButtonProps={{ 'aria-label': 'Show or hide the typed characters' }}
                />
                <Button type="submit" fullWidth loading={loginMutation.isPending}>
                  Sign in
                </Button>
                <Text fz="xs" c="dimmed">
                  <Anchor component={Link} to="/reset-password" fz="xs">
                    Forgot your password?
                  </Anchor>{' '}
                  We e-mail you a one-hour reset link. Scripting? The API reference is at{' '}
                  <Anchor href="/api/docs" fz="xs">
                    /api/docs
                  </Anchor>
                  .
                </Text>
              </Stack>
            </form>
          </Paper>
        </Stack>
      </Center>
      <Box p="md" maw={720} mx="auto">
        <CautionNote />
      </Box>
    </Box>
  );
}
