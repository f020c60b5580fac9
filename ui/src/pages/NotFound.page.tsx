import { Button } from '@mantine/core';
import { IconMapSearch } from '@tabler/icons-react';
import { Link, useLocation } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';

export default function NotFoundPage() {
  const { pathname } = useLocation();
  return (
    <EmptyState
      icon={IconMapSearch}
      title="No page at this address"
      actions={
        <Button component={Link} to="/">
          Go to the dashboard
        </Button>
      }
    >
      Nothing in Driftgrid lives at {pathname}. The link may be old, or the page may belong to a later release; the left
      rail lists every area there is.
    </EmptyState>
  );
}
