import { Button, Code } from '@mantine/core';
import { IconChartDots3 } from '@tabler/icons-react';
import { Link, useParams } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function SweepPage() {
  const { id = '' } = useParams();
  return (
    <>
      <PageHeader title={`Sweep ${id}`} description="Status, progress, provenance, results and plots of one sweep." />
      <EmptyState
        icon={IconChartDots3}
        title="The sweep page is on its way"
        actions={
          <Button component={Link} to="/catalogue" variant="light">
            Back to the catalogue
          </Button>
        }
      >
        This page will show the sweep's progress while it runs, then a results table you can sort and filter, heatmaps
        and line plots with the flagged region marked, its provenance and the zipped CSV export. Meanwhile scripts can read it
        from <Code>GET /api/sweeps/{id}</Code> with an access token.
      </EmptyState>
    </>
  );
}
