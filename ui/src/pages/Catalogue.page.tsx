import { Button } from '@mantine/core';
import { IconStack2 } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function CataloguePage() {
  return (
    <>
      <PageHeader title="Catalogue" description="Every sweep you can see: your own, those shared with you and the archived ones." />
      <EmptyState
        icon={IconStack2}
        title="No sweeps to list yet"
        actions={
          <>
            <Button component={Link} to="/sweeps/new">
              Start a sweep
            </Button>
            <Button component="a" href="/api/docs" variant="default">
              Browse sweeps through the API
            </Button>
          </>
        }
      >
        The catalogue will let you search sweeps by name, model, status, owner, tag and date, and open each one for its
        results table, plots, provenance and zipped CSV export. Sweeps you start, or that colleagues share with you,
        will appear here.
      </EmptyState>
    </>
  );
}
