import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { CreateInvitationInputSchema, ROLE_VALUES, type CreateInvitationInput, type Role } from '@midgray/shared';
import { Avatar } from '../../../components/ui/avatar.tsx';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { ErrorNote, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { useMe } from '../../auth/api/me.ts';
import { ChannelSettingsPanel } from '../../channels/components/channel-settings-panel.tsx';
import { useChannel } from '../../channels/current-channel.tsx';
import { useChangeRole, useInvitations, useInvite, useMembers, useRemoveMember, useRevokeInvitation } from '../api/team.ts';

const ROLE_HELP: Record<Role, string> = {
  host: 'plans tests, fills spec sheets, uploads, drafts the description',
  editor: 'picks up footage, grades, runs readouts, writes chapters',
  producer: 'approves publish dates, manages gear, everything a host may',
  admin: 'everything, plus members, roles and channel settings',
};

/** Team: members with their roles, and (for admins) invitations, role changes and removal. */
export function TeamPage() {
  const channel = useChannel();
  const me = useMe().data;
  const isAdmin = channel.role === 'admin';
  const members = useMembers(channel.id);
  const invitations = useInvitations(channel.id, isAdmin);
  const invite = useInvite(channel.id);
  const revoke = useRevokeInvitation(channel.id);
  const changeRole = useChangeRole(channel.id);
  const remove = useRemoveMember(channel.id);
  const toast = useToast();
  const [confirmRemove, setConfirmRemove] = useState<string | null>(null);
  const form = useForm({ resolver: zodResolver(CreateInvitationInputSchema), defaultValues: { email: '', role: 'editor' as Role } });

  const onError = (err: unknown) => toast({ tone: 'error', title: err instanceof Error ? err.message : 'That did not work' });

  return (
    <div>
      <PageHeader title="Team" description={`Who works on ${channel.name} and with which role. Roles are per channel: the same person can be an editor here and a producer elsewhere.`} />
      <div className="grid gap-5 lg:grid-cols-[2fr_1fr]">
        <Panel title="Members">
          {members.isLoading && <Loading what="Loading members" />}
          {members.error && <ErrorNote error={members.error} />}
          <ul className="divide-y divide-line">
            {members.data?.map((m) => (
              <li key={m.id} className="flex flex-wrap items-center gap-3 py-3">
                <Avatar name={m.name} />
                <div className="min-w-0 flex-1">
                  <p className="font-semibold">
                    {m.name} {m.userId === me?.user.id && <span className="text-xs font-normal text-ink-muted">(you)</span>}
                  </p>
                  <p className="truncate text-sm text-ink-muted">{m.email ?? m.login}</p>
                </div>
                {isAdmin ? (
                  <div className="flex w-full items-center justify-end gap-2 sm:w-auto">
                    <label className="sr-only" htmlFor={`role-${m.id}`}>
                      Role of {m.name}
                    </label>
                    <select
                      id={`role-${m.id}`}
                      className="rounded-md border border-line-strong bg-card px-2 py-1.5 text-sm"
                      value={m.role}
                      onChange={(e) => changeRole.mutate({ memberId: m.id, role: e.target.value as Role }, { onError, onSuccess: () => toast({ tone: 'success', title: `${m.name} is now ${e.target.value}` }) })}
                    >
                      {ROLE_VALUES.map((r) => (
                        <option key={r} value={r}>
                          {r}
                        </option>
                      ))}
                    </select>
                    {confirmRemove === m.id ? (
                      <span className="flex gap-1">
                        <Button variant="danger" onClick={() => remove.mutate(m.id, { onError, onSuccess: () => toast({ tone: 'success', title: `${m.name} was removed` }), onSettled: () => setConfirmRemove(null) })}>
                          Confirm removal
                        </Button>
                        <Button variant="ghost" onClick={() => setConfirmRemove(null)}>
                          Keep
                        </Button>
                      </span>
                    ) : (
                      <Button variant="ghost" onClick={() => setConfirmRemove(m.id)} aria-label={`Remove ${m.name}`}>
                        Remove
                      </Button>
                    )}
                  </div>
                ) : (
                  <span className="rounded-full bg-paper px-2.5 py-0.5 text-sm font-medium">{m.role}</span>
                )}
              </li>
            ))}
          </ul>
        </Panel>
        <div className="flex flex-col gap-5 lg:row-span-2">
          {isAdmin && (
            <Panel title="Invite someone">
              <form
                className="flex flex-col gap-3"
                onSubmit={form.handleSubmit((v) =>
                  invite.mutate(v as CreateInvitationInput, {
                    onError,
                    onSuccess: (r) => {
                      toast({ tone: 'success', title: r.mailSent ? `Invitation sent to ${r.invitation.email}` : `Invitation saved, but the e-mail could not be sent` });
                      form.reset({ email: '', role: v.role });
                    },
                  }),
                )}
              >
                <TextField label="E-mail address" type="email" autoComplete="off" {...form.register('email')} error={form.formState.errors.email?.message} />
                <SelectField label="Role" {...form.register('role')} hint={ROLE_HELP[form.watch('role') as Role]}>
                  {ROLE_VALUES.map((r) => (
                    <option key={r} value={r}>
                      {r}
                    </option>
                  ))}
                </SelectField>
                <Button variant="primary" type="submit" disabled={invite.isPending}>
                  Send invitation
                </Button>
              </form>
            </Panel>
          )}
          {isAdmin && (
            <Panel title="Open invitations">
              {invitations.data?.length === 0 && <p className="text-sm text-ink-muted">None open.</p>}
              <ul className="divide-y divide-line">
                {invitations.data?.map((i) => (
                  <li key={i.id} className="flex items-center justify-between gap-2 py-2 text-sm">
                    <span className="min-w-0">
                      <span className="block truncate font-medium">{i.email}</span>
                      <span className="text-ink-muted">
                        {i.role} · until {new Date(i.expiresAt).toLocaleDateString()}
                      </span>
                    </span>
                    <Button variant="ghost" onClick={() => revoke.mutate(i.id, { onError })} aria-label={`Revoke invitation for ${i.email}`}>
                      Revoke
                    </Button>
                  </li>
                ))}
              </ul>
            </Panel>
          )}
          <Panel title="What each role may do">
            <dl className="space-y-2 text-sm">
              {ROLE_VALUES.map((r) => (
                <div key={r}>
                  <dt className="font-semibold">{r}</dt>
                  <dd className="text-ink-soft">{ROLE_HELP[r]}</dd>
                </div>
              ))}
            </dl>
          </Panel>
        </div>
        {isAdmin && <ChannelSettingsPanel channel={channel} />}
      </div>
    </div>
  );
}
