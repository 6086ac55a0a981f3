import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { zodResolver } from '@hookform/resolvers/zod';
import { inviteUserSchema, type InviteUserInput } from '@shared/schemas/auth';
import { ROLE_LABELS, ROLES } from '@shared/schemas/common';
import { useUsers } from '@/features/users/api/get-users';
import { useInviteUser } from '@/features/users/api/invite-user';
import { useUpdateUser } from '@/features/users/api/update-user';
import { useEndSessions } from '@/features/users/api/end-sessions';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { SelectField, TextField } from '@/components/ui/field';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { useMe } from '@/features/auth/api/get-me';

type Person = NonNullable<ReturnType<typeof useUsers>['data']>[number];
const col = createColumnHelper<Person>();

function PeopleTable({
  people,
  meId,
  onRole,
  onDisabled,
  onEndSessions,
}: {
  people: Person[];
  meId: string | undefined;
  onRole: (id: string, role: InviteUserInput['role']) => void;
  onDisabled: (id: string, disabled: boolean) => void;
  onEndSessions: (id: string) => void;
}) {
  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Name',
        cell: (c) => (
          <>
            <div className="font-medium">{c.getValue()}</div>
            <div className="text-xs text-ink-soft">{c.row.original.email}</div>
          </>
        ),
      }),
      col.accessor('role', {
        header: 'Role',
        cell: (c) => {
          const u = c.row.original;
          return (
            <>
              <label className="sr-only" htmlFor={`role-${u.id}`}>
                Role of {u.name}
              </label>
              <select
                id={`role-${u.id}`}
                className="min-h-touch rounded-md border border-line bg-card px-2"
                value={c.getValue()}
                disabled={u.id === meId}
                onChange={(e) => onRole(u.id, e.target.value as InviteUserInput['role'])}
              >
                {ROLES.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_LABELS[r]}
                  </option>
                ))}
              </select>
            </>
          );
        },
      }),
      col.display({
        id: 'state',
        header: 'State',
        cell: (c) => (c.row.original.disabled ? 'Disabled' : c.row.original.invited ? 'Invited, no password yet' : 'Active'),
      }),
      col.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        meta: { cellClassName: 'text-right' },
        cell: (c) => {
          const u = c.row.original;
          return (
            u.id !== meId && (
              <div className="flex justify-end gap-2">
                <Button variant="ghost" title="Signs this person out on every device at once" onClick={() => onEndSessions(u.id)}>
                  Sign out everywhere
                </Button>
                <Button variant="secondary" onClick={() => onDisabled(u.id, !u.disabled)}>
                  {u.disabled ? 'Enable' : 'Disable'}
                </Button>
              </div>
            )
          );
        },
      }),
    ],
    [meId, onRole, onDisabled, onEndSessions],
  );
  const table = useReactTable({ data: people, columns, getCoreRowModel: getCoreRowModel(), getRowId: (u) => u.id });
  return <DataTable table={table} />;
}

export default function PeoplePage() {
  const users = useUsers();
  const me = useMe();
  const invite = useInviteUser();
  const update = useUpdateUser();
  const endSessions = useEndSessions();
  const form = useForm<InviteUserInput>({
    resolver: zodResolver(inviteUserSchema),
    defaultValues: { email: '', name: '', role: 'technician' },
  });

  return (
    <>
      <PageHeader title="People" subtitle="Everyone in your organisation and what they may do." />
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <Card className="overflow-x-auto p-0">
          {users.isPending && <Loading />}
          {users.isError && <Notice tone="error">{users.error.message}</Notice>}
          {users.data && (
            <PeopleTable
              people={users.data}
              meId={me.data?.id}
              onRole={(id, role) => update.mutate({ id, role })}
              onDisabled={(id, disabled) => update.mutate({ id, disabled })}
              onEndSessions={(id) => endSessions.mutate(id)}
            />
          )}
          {update.isError && <Notice tone="error">{update.error.message}</Notice>}
          {endSessions.isSuccess && <Notice tone="success">Their sessions have ended.</Notice>}
        </Card>
        <Card>
          <h2 className="text-lg font-semibold">Invite someone</h2>
          <p className="mt-1 text-sm text-ink-soft">They get an e-mail with a one-time link to choose a password.</p>
          <form
            className="mt-4 flex flex-col gap-3"
            noValidate
            onSubmit={form.handleSubmit(async (v) => {
              await invite.mutateAsync(v).then(
                () => form.reset(),
                () => undefined,
              );
            })}
          >
            <TextField label="Name" {...form.register('name')} error={form.formState.errors.name?.message} />
            <TextField label="E-mail" type="email" {...form.register('email')} error={form.formState.errors.email?.message} />
            <SelectField label="Role" {...form.register('role')}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </SelectField>
            {invite.isError && <Notice tone="error">{invite.error.message}</Notice>}
            {invite.isSuccess && <Notice tone="success">Invitation sent to {invite.data.email}.</Notice>}
            <Button type="submit" disabled={form.formState.isSubmitting}>
              Send invitation
            </Button>
          </form>
        </Card>
      </div>
    </>
  );
}
