import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { changePasswordRequest } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorNote, TextField } from '@/components/ui/text-field';
import { useMe } from '@/lib/api/me';
import { useChangePassword } from '../api/change-password';
import { useSignOutEverywhere } from '../api/sign-out-everywhere';

/** Everyone: their own password, and signing out of every browser at once. */
export default function AccountPage() {
  const me = useMe();
  const change = useChangePassword();
  const everywhere = useSignOutEverywhere();
  const navigate = useNavigate();
  const [f, setF] = useState({ currentPassword: '', newPassword: '' });
  const [problem, setProblem] = useState<string | undefined>();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const r = changePasswordRequest.safeParse(f);
    if (!r.success) return setProblem(r.error.issues[0]?.message);
    setProblem(undefined);
    change.mutate(r.data, { onSuccess: () => setF({ currentPassword: '', newPassword: '' }) });
  };
  return (
    <div className="max-w-xl space-y-6">
      <PageHeader title="Account" />
      <p>
        {me.data?.name} · {me.data?.email} · {me.data?.shopName}
      </p>
      <form onSubmit={submit} noValidate aria-label="Change password" className="space-y-4 rounded-lg border border-stone-300 bg-white p-4">
        <h2 className="text-lg font-semibold">Change password</h2>
        <TextField
          label="Current password"
          type="password"
          autoComplete="current-password"
          value={f.currentPassword}
          onChange={(e) => setF({ ...f, currentPassword: e.target.value })}
        />
        <TextField
          label="New password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters; common passwords are refused. Your other sessions are signed out."
          value={f.newPassword}
          onChange={(e) => setF({ ...f, newPassword: e.target.value })}
          error={problem}
        />
        <div aria-live="polite">
          <ErrorNote error={change.error} />
          {change.isSuccess && <p className="text-sm font-semibold text-ok">Password changed; your other sessions are signed out.</p>}
        </div>
        <Button type="submit" disabled={change.isPending}>
          {change.isPending ? 'Saving…' : 'Change password'}
        </Button>
      </form>
      <section className="space-y-2 rounded-lg border border-stone-300 bg-white p-4">
        <h2 className="text-lg font-semibold">Sign out everywhere</h2>
        <p className="text-sm text-stone-700">Ends every session of your account: this browser, the bench tablet, a phone you lost.</p>
        <ErrorNote error={everywhere.error} />
        <Button variant="danger" disabled={everywhere.isPending} onClick={() => everywhere.mutate(undefined, { onSuccess: () => void navigate('/sign-in') })}>
          Sign out everywhere
        </Button>
      </section>
    </div>
  );
}
