import { Button } from '@mantine/core';
import { IconDatabase } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function DatasetsPage() {
  return (
    <>
      <PageHeader title="Datasets" description="Measured data uploaded as CSV, with a unit for every column." />
      <EmptyState
        icon={IconDatabase}
        title="No datasets uploaded yet"
        actions={
          <>
            <Button component={Link} to="/fits" variant="light">
              See what fits will offer
            </Button>
            <Button component="a" href="/api/docs" variant="default">
              Upload through the API
            </Button>
          </>
        }
      >
        Upload a CSV with a header row (for example probe potential in V and density in m⁻³), map each column to a
        unit, and the rows become a source for fits beside sweep results. Rows that do not parse are reported with
        their line and column.
      </EmptyState>
    </>
  );
}
