import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { inviteUserSchema, type InviteUserInput } from '@shared/schemas/auth';
import { ROLE_LABELS, ROLES } from '@shared/schemas/common';
import { useUsers } from '@/features/users/api/get-users';
import { useInviteUser } from '@/features/users/api/invite-user';
import { useUpdateUser } from '@/features/users/api/update-user';
import { useEndSessions } from '@/features/users/api/end-sessions';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { useMe } from '@/features/auth/api/get-me';

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
            <table className="w-full text-left text-sm">
              <thead className="border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft">
                <tr>
                  <th className="px-4 py-3">Name</th>
                  <th className="px-4 py-3">Role</th>
                  <th className="px-4 py-3">State</th>
                  <th className="px-4 py-3"><span className="sr-only">Actions</span></th>
                </tr>
              </thead>
              <tbody>
                {users.data.map((u) => (
                  <tr key={u.id} className="border-b border-line last:border-0">
                    <td className="px-4 py-2">
                      <div className="font-medium">{u.name}</div>
                      <div className="text-xs text-ink-soft">{u.email}</div>
                    </td>
                    <td className="px-4 py-2">
                      <label className="sr-only" htmlFor={`role-${u.id}`}>Role of {u.name}</label>
                      <select
                        id={`role-${u.id}`}
                        className="min-h-touch rounded-md border border-line bg-card px-2"
                        value={u.role}
                        disabled={u.id === me.data?.id}
                        onChange={(e) => update.mutate({ id: u.id, role: e.target.value as InviteUserInput['role'] })}
                      >
                        {ROLES.map((r) => (
                          <option key={r} value={r}>{ROLE_LABELS[r]}</option>
                        ))}
                      </select>
                    </td>
                    <td className="px-4 py-2">{u.disabled ? 'Disabled' : u.invited ? 'Invited, no password yet' : 'Active'}</td>
                    <td className="px-4 py-2 text-right">
                      {u.id !== me.data?.id && (
                        <div className="flex justify-end gap-2">
                          <Button
                            variant="ghost"
                            title="Signs this person out on every device at once"
                            onClick={() => endSessions.mutate(u.id)}
                          >
                            Sign out everywhere
                          </Button>
                          <Button variant="secondary" onClick={() => update.mutate({ id: u.id, disabled: !u.disabled })}>
                            {u.disabled ? 'Enable' : 'Disable'}
                          </Button>
                        </div>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
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
              await invite.mutateAsync(v).then(() => form.reset(), () => undefined);
            })}
          >
            <TextField label="Name" {...form.register('name')} error={form.formState.errors.name?.message} />
            <TextField label="E-mail" type="email" {...form.register('email')} error={form.formState.errors.email?.message} />
            <SelectField label="Role" {...form.register('role')}>
              {ROLES.map((r) => (
                <option key={r} value={r}>{ROLE_LABELS[r]}</option>
              ))}
            </SelectField>
            {invite.isError && <Notice tone="error">{invite.error.message}</Notice>}
            {invite.isSuccess && <Notice tone="success">Invitation sent to {invite.data.email}.</Notice>}
            <Button type="submit" disabled={form.formState.isSubmitting}>Send invitation</Button>
          </form>
        </Card>
      </div>
    </>
  );
}
