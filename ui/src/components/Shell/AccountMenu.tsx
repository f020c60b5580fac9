import { Avatar, Group, Menu, Text, UnstyledButton } from '@mantine/core';
import { IconChevronDown, IconKey, IconLock, IconLogout } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { useMe, useSignOut } from '../../api/auth.js';
import { accountPaths } from '../../routes.js';

export function initials(name: string | undefined): string {
  const parts = (name ?? '').trim().split(/\s+/).filter(Boolean);
  if (parts.length === 0) return '?';
  return (parts[0]![0]! + (parts.length > 1 ? parts[parts.length - 1]![0]! : '')).toUpperCase();
}

export function AccountMenu() {
  const { data: me } = useMe();
  const signOut = useSignOut();
  return (
    <Menu position="bottom-end" width={240} withinPortal shadow="md">
      <Menu.Target>
        <UnstyledButton
          aria-label="Account menu"
          data-testid="account-menu"
          style={{ borderRadius: 6, padding: '4px 6px' }}
        >
          <Group gap={8} wrap="nowrap">
            <Avatar size={28} radius="xl" color="tide" variant="filled">
              {initials(me?.name)}
            </Avatar>
            <Text fz="sm" fw={500} visibleFrom="sm" lineClamp={1} maw={180}>
              {me?.name}
            </Text>
            <IconChevronDown size={14} aria-hidden />
          </Group>
        </UnstyledButton>
      </Menu.Target>
      <Menu.Dropdown>
        <Menu.Label>
          <Text fz="sm" fw={500} c="var(--mantine-color-text)" lineClamp={1}>
            {me?.name}
          </Text>
          <Text fz="xs" c="dimmed" lineClamp={1}>
            {me?.email} · {me?.role}
          </Text>
        </Menu.Label>
        <Menu.Divider />
        <Menu.Item component={Link} to={accountPaths.tokens} leftSection={<IconKey size={16} aria-hidden />}>
          API tokens
        </Menu.Item>
        <Menu.Item component={Link} to={accountPaths.password} leftSection={<IconLock size={16} aria-hidden />}>
          Password
        </Menu.Item>
        <Menu.Divider />
        <Menu.Item onClick={signOut} leftSection={<IconLogout size={16} aria-hidden />} data-testid="sign-out">
          Sign out
        </Menu.Item>
      </Menu.Dropdown>
    </Menu>
  );
}
