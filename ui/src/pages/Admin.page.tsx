import { Button } from '@mantine/core';
import { IconShieldLock } from '@tabler/icons-react';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function AdminPage() {
  return (
    <>
      <PageHeader title="Admin" description="Users and roles, quotas, the job queue and the outgoing mailbox." />
      <EmptyState
        icon={IconShieldLock}
        title="Administration tools are on their way"
        actions={
          <>
            <Button component="a" href="/api/docs" variant="light">
              Open the API reference
            </Button>
          </>
        }
      >
        From here you will invite people and set their roles, set per-role quota defaults and per-user overrides,
        watch the job queue, and read the mail the server sends (invitations, password resets). Until then the
        same operations are available to admins through the API.
      </EmptyState>
    </>
  );
}
