import { Tabs } from '@mantine/core';
import { IconClipboardList, IconGauge, IconMail, IconMailForward, IconStack3, IconUsers } from '@tabler/icons-react';
import { useSearchParams } from 'react-router-dom';
import { AdminAudit } from '../components/AdminAudit/AdminAudit.js';
import { AdminInvitations } from '../components/AdminInvitations/AdminInvitations.js';
import { AdminMailbox } from '../components/AdminMailbox/AdminMailbox.js';
import { AdminQueue } from '../components/AdminQueue/AdminQueue.js';
import { AdminQuotas } from '../components/AdminQuotas/AdminQuotas.js';
import { AdminUsers } from '../components/AdminUsers/AdminUsers.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';

const TABS = ['users', 'invitations', 'quotas', 'queue', 'mailbox', 'audit'] as const;
type Tab = (typeof TABS)[number];

/** The admin console: one tab per job; the open tab is kept in the address (?tab=) so it can be linked. */
export default function AdminPage() {
  const [params, setParams] = useSearchParams();
  const raw = params.get('tab');
  const tab: Tab = (TABS as readonly string[]).includes(raw ?? '') ? (raw as Tab) : 'users';
  return (
    <>
      <PageHeader
        title="Admin"
        description="People and roles, invitations, quotas, the queue of sweep chunks, the built-in mailbox and the audit log."
      />
      <Tabs
        value={tab}
        onChange={(v) => setParams(v && v !== 'users' ? { tab: v } : {}, { replace: true })}
        keepMounted={false}
      >
        <Tabs.List mb="md">
          <Tabs.Tab value="users" leftSection={<IconUsers size={16} />}>
            Users
          </Tabs.Tab>
          <Tabs.Tab value="invitations" leftSection={<IconMailForward size={16} />}>
            Invitations
          </Tabs.Tab>
          <Tabs.Tab value="quotas" leftSection={<IconGauge size={16} />}>
            Quotas
          </Tabs.Tab>
          <Tabs.Tab value="queue" leftSection={<IconStack3 size={16} />}>
            Queue
          </Tabs.Tab>
          <Tabs.Tab value="mailbox" leftSection={<IconMail size={16} />}>
            Mailbox
          </Tabs.Tab>
          <Tabs.Tab value="audit" leftSection={<IconClipboardList size={16} />}>
            Audit log
          </Tabs.Tab>
        </Tabs.List>
        <Tabs.Panel value="users">
          <AdminUsers />
        </Tabs.Panel>
        <Tabs.Panel value="invitations">
          <AdminInvitations />
        </Tabs.Panel>
        <Tabs.Panel value="quotas">
          <AdminQuotas />
        </Tabs.Panel>
        <Tabs.Panel value="queue">
          <AdminQueue />
        </Tabs.Panel>
        <Tabs.Panel value="mailbox">
          <AdminMailbox />
        </Tabs.Panel>
        <Tabs.Panel value="audit">
          <AdminAudit />
        </Tabs.Panel>
      </Tabs>
    </>
  );
}
