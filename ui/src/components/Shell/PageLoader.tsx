import { Center, Loader } from '@mantine/core';

/** Shown while a lazy page's code arrives. */
export function PageLoader() {
  return (
    <Center py={64} aria-live="polite">
      <Loader size="sm" aria-label="Loading page" />
    </Center>
  );
}
