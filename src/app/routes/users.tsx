import { zodResolver } from '@hookform/resolvers/zod';
import { Icon } from '../../components/ui/icon';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { ROLE_LABELS, ROLES, type Role } from '#shared/api/roles';
import { inviteSchema, type InviteInput } from '#shared/api/users';
import { Field, FormError } from '../../components/ui/field';
import { meQuery } from '../../features/auth/api';
import { jobsQuery } from '../../features/pieces/api';
import { inviteUser, updateUser, usersQuery } from '../../features/users/api';
import { ApiFailure } from '../../lib/api';

export function UsersPage() {
  const qc = useQueryClient();
  const { data: me } = useQuery(meQuery);
  const { data: users = [] } = useQuery(usersQuery);
  const { data: jobs = [] } = useQuery(jobsQuery);
  const [sent, setSent] = useState<string | null>(null);
  const form = useForm<InviteInput>({ resolver: zodResolver(inviteSchema), defaultValues: { role: 'inspector' } });
  const role = useWatch({ control: form.control, name: 'role' });
  const invite = useMutation({
    mutationFn: inviteUser,
    onSuccess: async (u) => {
      setSent(`Invitation sent to ${u.email}.`);
      form.reset({ email: '', name: '', role: 'inspector' });
      await qc.invalidateQueries({ queryKey: usersQuery.queryKey });
    },
    onError: (e) => {
      setSent(null);
      if (e instanceof ApiFailure) for (const [k, v] of Object.entries(e.fieldErrors)) form.setError(k as keyof InviteInput, { message: v[0] });
    },
  });
  const update = useMutation({
    mutationFn: ({ id, ...patch }: { id: string; role?: Role; active?: boolean }) => updateUser(id, patch),
    onSuccess: () => qc.invalidateQueries({ queryKey: usersQuery.queryKey }),
  });

  return (
    <section aria-labelledby="users-title">
      <h1 id="users-title" className="mb-4 text-2xl font-semibold">
        Users of {me?.plantName}
      </h1>
      <form className="card mb-6" onSubmit={form.handleSubmit((v) => invite.mutate(v))} noValidate aria-labelledby="invite-title">
        <h2 id="invite-title" className="mb-3 text-xl font-semibold">
          Invite a user
        </h2>
        <FormError message={invite.error && !(invite.error instanceof ApiFailure && Object.keys(invite.error.fieldErrors).length) ? invite.error.message : null} />
        <div className="grid gap-x-4 sm:grid-cols-2">
          <Field id="invite-email" label="E-mail" error={form.formState.errors.email?.message}>
            <input id="invite-email" type="email" className="input" {...form.register('email')} />
          </Field>
          <Field id="invite-name" label="Name" error={form.formState.errors.name?.message}>
            <input id="invite-name" className="input" {...form.register('name')} />
          </Field>
          <Field id="invite-role" label="Role" error={form.formState.errors.role?.message}>
            <select id="invite-role" className="input" {...form.register('role')}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          </Field>
          {role === 'viewer' && (
            <Field id="invite-job" label="Job the viewer may see" error={form.formState.errors.jobId?.message}>
              <select id="invite-job" className="input" {...form.register('jobId', { setValueAs: (v: string) => v || undefined })}>
                <option value="">Choose a job</option>
                {jobs.map((j) => (
                  <option key={j.id} value={j.id}>
                    {j.number} {j.name}
                  </option>
                ))}
              </select>
            </Field>
          )}
        </div>
        <button type="submit" className="btn-primary" disabled={invite.isPending}>
          Send the invitation
        </button>
        {sent && (
          <p className="mt-2 font-semibold text-ok" role="status">
            <Icon name="check" /> {sent}
          </p>
        )}
      </form>
      <div className="overflow-x-auto rounded-lg border border-concrete-200 bg-white">
        <table className="w-full text-left">
          <caption className="sr-only">Users</caption>
          <thead className="bg-concrete-100 text-sm">
            <tr>
              <th className="px-3 py-2">Name</th>
              <th className="px-3 py-2">E-mail</th>
              <th className="px-3 py-2">Role</th>
              <th className="px-3 py-2">State</th>
              <th className="px-3 py-2">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {users.map((u) => (
              <tr key={u.id} className="border-t border-concrete-100">
                <td className="px-3 py-2">{u.name}</td>
                <td className="px-3 py-2">{u.email}</td>
                <td className="px-3 py-2">
                  <label className="sr-only" htmlFor={`role-${u.id}`}>
                    Role of {u.name}
                  </label>
                  <select id={`role-${u.id}`} className="input" value={u.role} disabled={u.id === me?.id} onChange={(e) => update.mutate({ id: u.id, role: e.target.value as Role })}>
                    {ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABELS[r]}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="px-3 py-2">{!u.active ? <><Icon name="cross" /> Deactivated</> : u.invited ? <><Icon name="clock" /> Invited</> : <><Icon name="check" /> Active</>}</td>
                <td className="px-3 py-2">
                  {u.id !== me?.id && (
                    <button type="button" className="btn-quiet" onClick={() => update.mutate({ id: u.id, active: !u.active })}>
                      {u.active ? 'Deactivate' : 'Reactivate'}
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
