import { Button } from '@mantine/core';
import { IconLock } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function PasswordPage() {
  return (
    <>
      <PageHeader title="Password" description="Change the password you sign in with." />
      <EmptyState
        icon={IconLock}
        title="Changing your password here is on its way"
        actions={
          <>
            <Button component={Link} to="/" variant="light">
              Back to the dashboard
            </Button>
          </>
        }
      >
        Until then, an administrator can send you a password-reset link by e-mail; following it lets you choose a new
        password. Your current password keeps working meanwhile.
      </EmptyState>
    </>
  );
}
