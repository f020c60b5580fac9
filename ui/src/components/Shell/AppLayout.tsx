import { AppShell, Burger, Group, ScrollArea } from '@mantine/core';
import { useDisclosure } from '@mantine/hooks';
import { Suspense, useEffect } from 'react';
import { Link, Outlet, useMatches } from 'react-router-dom';
import { NameMark } from '../NameMark/NameMark.js';
import { AccountMenu } from './AccountMenu.js';
import { CautionNote } from './CautionNote.js';
import { ColorSchemeToggle } from './ColorSchemeToggle.js';
import { NavRail } from './NavRail.js';
import { PageLoader } from './PageLoader.js';

/** Keeps the browser tab's title in step with the route table. */
function useDocumentTitle() {
  const matches = useMatches();
  const title = [...matches]
    .reverse()
    .map((m) => (m.handle as { title?: string } | undefined)?.title)
    .find(Boolean);
  useEffect(() => {
    document.title = title ? `${title} · Driftgrid` : 'Driftgrid';
  }, [title]);
}

export function AppLayout() {
  const [opened, { toggle, close }] = useDisclosure(false);
  useDocumentTitle();
  return (
    <AppShell
      header={{ height: 52 }}
      navbar={{ width: 216, breakpoint: 'sm', collapsed: { mobile: !opened } }}
      footer={{ height: { base: 52, sm: 34 } }}
      padding="md"
    >
      <AppShell.Header>
        <Group h="100%" px="md" justify="space-between" wrap="nowrap">
          <Group gap="sm" wrap="nowrap">
            <Burger
              opened={opened}
              onClick={toggle}
              hiddenFrom="sm"
              size="sm"
              aria-label={opened ? 'Close navigation' : 'Open navigation'}
            />
            <Link to="/" aria-label="Driftgrid dashboard" style={{ textDecoration: 'none', color: 'inherit' }}>
              <NameMark size={26} />
            </Link>
          </Group>
          <Group gap="xs" wrap="nowrap">
            <ColorSchemeToggle />
            <AccountMenu />
          </Group>
        </Group>
      </AppShell.Header>
      <AppShell.Navbar p="xs">
        <AppShell.Section grow component={ScrollArea}>
          <NavRail onNavigate={close} />
        </AppShell.Section>
      </AppShell.Navbar>
      <AppShell.Main>
        <Suspense fallback={<PageLoader />}>
          <Outlet />
        </Suspense>
      </AppShell.Main>
      <AppShell.Footer px="md">
        <Group h="100%" align="center" wrap="nowrap">
          <CautionNote ta="left" />
        </Group>
      </AppShell.Footer>
    </AppShell>
  );
}
