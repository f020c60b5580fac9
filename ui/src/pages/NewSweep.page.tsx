import { Button } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

export default function NewSweepPage() {
  return (
    <>
      <PageHeader title="New sweep" description="Define a scan over a model's inputs, preview its size against your quota, and queue it." />
      <EmptyState
        icon={IconPlus}
        title="The sweep builder is on its way"
        actions={
          <>
            <Button component={Link} to="/single-point" variant="light">
              Try one point first
            </Button>
            <Button component="a" href="/api/docs" variant="default">
              Submit a definition through the API
            </Button>
          </>
        }
      >
        Here you will pick a model, give each input a fixed value, an expression or an axis (linear, log or a list),
        choose a grid or a random design, and see the point count, a sample point and its validity flags before you
        submit. Input you type is kept if your session ends.
      </EmptyState>
    </>
  );
}
