import { Button, Code, Stack } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';
import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { EmptyState } from '../EmptyState/EmptyState.js';

/** Last line of defence for a page that throws or whose code fails to load (e.g. after a deploy). */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : String(error);
  const chunkFailed = /dynamically imported module|Importing a module script failed|Failed to fetch/i.test(message);
  return (
    <EmptyState
      icon={IconAlertTriangle}
      title={chunkFailed ? 'This page could not be loaded' : 'Something went wrong on this page'}
      actions={
        <>
          <Button onClick={() => window.location.reload()}>Reload</Button>
          <Button variant="default" component="a" href="/">
            Go to the dashboard
          </Button>
        </>
      }
    >
      <Stack gap={6} align="center">
        <span>
          {chunkFailed
            ? 'Driftgrid may have been updated since this tab opened. Reloading fetches the current version; drafts you were typing are kept.'
            : 'Reloading usually helps. Drafts you were typing are kept in this browser.'}
        </span>
        <Code>{message}</Code>
      </Stack>
    </EmptyState>
  );
}
