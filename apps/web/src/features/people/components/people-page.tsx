import { useState, type FormEvent, type ReactNode } from 'react';
import { createInvitationRequest, roleLabels, roles, type Invitation, type Role, type ShopMember } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/select-field';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { ErrorNote, TextField } from '@/components/ui/text-field';
import { useMe } from '@/lib/api/me';
import { useCreateInvitation } from '../api/create-invitation';
import { useInvitations } from '../api/get-invitations';
import { usePeople } from '../api/get-people';
import { useResendInvitation } from '../api/resend-invitation';
import { useUpdatePerson } from '../api/update-person';

function InviteForm() {
  const create = useCreateInvitation();
  const [f, setF] = useState({ name: '', email: '', role: 'tech' as Role });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const r = createInvitationRequest.safeParse(f);
    if (!r.success) return setErrors(Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message])));
    setErrors({});
    create.mutate(r.data, { onSuccess: () => setF({ name: '', email: '', role: f.role }) });
  };
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label="Invite a person"
      className="grid gap-3 rounded-lg border border-stone-300 bg-white p-4 sm:grid-cols-[1fr_1fr_auto_auto] sm:items-end"
    >
      <TextField label="Name" value={f.name} onChange={(e) => setF({ ...f, name: e.target.value })} error={errors.name} autoComplete="off" />
      <TextField label="E-mail" type="email" value={f.email} onChange={(e) => setF({ ...f, email: e.target.value })} error={errors.email} autoComplete="off" />
      <SelectField label="Role" value={f.role} options={roles} labels={roleLabels} onChange={(role) => setF({ ...f, role })} />
      <Button type="submit" disabled={create.isPending}>
        {create.isPending ? 'Sending…' : 'Send invitation'}
      </Button>
      <div className="sm:col-span-4" aria-live="polite">
        <ErrorNote error={create.error} />
        {create.isSuccess && <p className="text-sm font-semibold text-ok">Invitation e-mailed to {create.data.email}.</p>}
      </div>
    </form>
  );
}

/** One line of the people screen: who (title, detail), the admin's actions on them, and why an action failed. */
function MemberRow({ title, detail, error, children }: { title: ReactNode; detail: ReactNode; error: Error | null; children: ReactNode }) {
  return (
    <li className="flex flex-wrap items-center gap-3 border-b border-stone-200 py-2 last:border-0">
      <div className="min-w-48 flex-1">
        {title}
        <p className="text-sm text-stone-700">{detail}</p>
      </div>
      {children}
      {error && (
        <p role="alert" className="w-full text-sm text-high">
          {error.message}
        </p>
      )}
    </li>
  );
}

function PersonRow({ p, self }: { p: ShopMember; self: boolean }) {
  const update = useUpdatePerson();
  const active = !p.deactivatedAt;
  const title = (
    <p className={`font-semibold ${active ? '' : 'text-stone-500 line-through'}`}>
      {p.name} {self && <span className="text-sm font-normal">(you)</span>}
    </p>
  );
  return (
    <MemberRow title={title} detail={p.email} error={update.error}>
      {!active && <span className="rounded bg-stone-200 px-2 text-sm">Deactivated</span>}
      <SelectField
        label={`Role of ${p.name}`}
        hideLabel
        value={p.role}
        options={roles}
        labels={roleLabels}
        disabled={update.isPending}
        onChange={(role) => update.mutate({ id: p.id, role })}
        className="w-auto"
      />
      {!self && (
        <Button
          variant={active ? 'secondary' : 'primary'}
          disabled={update.isPending}
          onClick={() => update.mutate({ id: p.id, active: !active })}
          aria-label={`${active ? 'Deactivate' : 'Reactivate'} ${p.name}`}
        >
          {active ? 'Deactivate' : 'Reactivate'}
        </Button>
      )}
    </MemberRow>
  );
}

function InvitationRow({ i }: { i: Invitation }) {
  const resend = useResendInvitation();
  const expired = new Date(i.expiresAt).getTime() < Date.now();
  const title = (
    <p className="font-semibold">
      {i.name} · {roleLabels[i.role]}
    </p>
  );
  return (
    <MemberRow
      title={title}
      detail={`${i.email} · ${i.acceptedAt ? 'joined' : expired ? 'expired' : `open until ${i.expiresAt.slice(0, 10)}`}`}
      error={resend.error}
    >
      {!i.acceptedAt && (
        <Button variant="secondary" disabled={resend.isPending} onClick={() => resend.mutate(i.id)} aria-label={`Resend the invitation to ${i.email}`}>
          {resend.isSuccess ? 'Sent again' : 'Resend'}
        </Button>
      )}
    </MemberRow>
  );
}

/** The admin's people screen: invite by e-mail, change role, deactivate (ends their sessions), resend. */
export default function PeoplePage() {
  const me = useMe();
  const people = usePeople();
  const invitations = useInvitations();
  return (
    <div className="max-w-4xl space-y-6">
      <PageHeader title="People" />
      <section aria-labelledby="invite" className="space-y-2">
        <h2 id="invite" className="text-lg font-semibold">
          Invite someone
        </h2>
        <p className="text-sm text-stone-700">They get an e-mail with a link to choose their password (valid 7 days).</p>
        <InviteForm />
      </section>
      <section aria-labelledby="members" className="rounded-lg border border-stone-300 bg-white p-4">
        <h2 id="members" className="text-lg font-semibold">
          In the shop
        </h2>
        <p className="text-sm text-stone-700">Deactivating signs the person out everywhere at once; their work stays in the history.</p>
        <QueryState query={people} label="the people">
          {(d) => (
            <ul>
              {d.items.map((p) => (
                <PersonRow key={p.id} p={p} self={p.id === me.data?.id} />
              ))}
            </ul>
          )}
        </QueryState>
      </section>
      <section aria-labelledby="invited" className="rounded-lg border border-stone-300 bg-white p-4">
        <h2 id="invited" className="text-lg font-semibold">
          Invitations
        </h2>
        <QueryState query={invitations} label="the invitations">
          {(d) =>
            d.items.length ? (
              <ul>
                {d.items.map((i) => (
                  <InvitationRow key={i.id} i={i} />
                ))}
              </ul>
            ) : (
              <p className="text-stone-700">None yet.</p>
            )
          }
        </QueryState>
      </section>
    </div>
  );
}
