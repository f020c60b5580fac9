import { Button } from '@mantine/core';
import { IconLock } from '@tabler/icons-react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { hasRole, useMe } from '../api/auth.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import type { Role } from './session.js';

const ROLE_WORD: Record<Role, string> = { admin: 'administrators', researcher: 'researchers', reviewer: 'reviewers' };

/** Explains, rather than hides, a page the signed-in role may not use. The server enforces it too. */
export function RoleGate({ roles, children }: { roles?: readonly Role[]; children: ReactNode }) {
  const { data: me } = useMe();
  if (!roles || hasRole(me, roles)) return <>{children}</>;
  return (
    <EmptyState
      icon={IconLock}
      title="Not available to your role"
      actions={
        <Button component={Link} to="/" variant="light">
          Back to the dashboard
        </Button>
      }
    >
      This page is for {roles.map((r) => ROLE_WORD[r]).join(' and ')}. You are signed in as a {me?.role ?? 'user'}; ask
      an administrator if your work needs a different role.
    </EmptyState>
  );
}
