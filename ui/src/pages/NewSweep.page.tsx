import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { SweepBuilder } from '../components/SweepBuilder/SweepBuilder.js';

export default function NewSweepPage() {
  return (
    <>
      <PageHeader
        title="New sweep"
        description="Define a scan over a model's inputs, check its size, a sample point and your quota, then queue it."
      />
      <SweepBuilder />
    </>
  );
}
