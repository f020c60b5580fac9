import { Button } from '@mantine/core';
import { IconTarget } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function SinglePointPage() {
  return (
    <>
      <PageHeader title="Single point" description="Evaluate a model at one parameter set and read every output with its unit and flags." />
      <EmptyState
        icon={IconTarget}
        title="Single-point evaluation is on its way"
        actions={
          <>
            <Button component="a" href="/api/docs" variant="light">
              Evaluate through the API
            </Button>
            <Button component={Link} to="/" variant="default">
              Back to the dashboard
            </Button>
          </>
        }
      >
        Pick a model, enter inputs with units (20 eV, 1500 G, 3 cm), and see drift speeds, gyroradii and the
        validity flags for that point at once, with radial profiles where the model has them. It is the quickest way
        to sanity-check a region before sweeping it.
      </EmptyState>
    </>
  );
}
