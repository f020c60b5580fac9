import { Anchor, Button } from '@mantine/core';
import { IconKey } from '@tabler/icons-react';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function ApiTokensPage() {
  return (
    <>
      <PageHeader
        title="API tokens"
        description="Personal tokens for scripts and notebooks that call the Driftgrid API."
      />
      <EmptyState
        icon={IconKey}
        title="No tokens yet"
        actions={
          <>
            <Button component="a" href="/api/docs" variant="light">
              Open the API reference
            </Button>
          </>
        }
      >
        You will create named tokens here, read-only or read-write, with an optional expiry; the secret is shown once.
        Scripts send it as a Bearer token. Until this page arrives, a script can sign in through
        <Anchor href="/api/docs">POST /api/auth/login</Anchor> and use the access token it returns.
      </EmptyState>
    </>
  );
}
