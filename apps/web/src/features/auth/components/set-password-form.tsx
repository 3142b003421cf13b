import { useState, type FormEvent } from 'react';
import { newPasswordSchema } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { ErrorNote, TextField } from '@/components/ui/text-field';

/** A new password typed twice; the server also refuses common passwords and says so. */
export function SetPasswordForm({
  submitLabel,
  pending,
  error,
  onSubmit,
}: {
  submitLabel: string;
  pending: boolean;
  error: Error | null;
  onSubmit: (password: string) => void;
}) {
  const [password, setPassword] = useState('');
  const [again, setAgain] = useState('');
  const [problem, setProblem] = useState<string | undefined>();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const r = newPasswordSchema.safeParse(password);
    if (!r.success) return setProblem(r.error.issues[0]?.message);
    if (password !== again) return setProblem('the two passwords differ');
    setProblem(undefined);
    onSubmit(password);
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        hint="At least 10 characters; common passwords are refused"
        error={problem}
      />
      <TextField label="The same password again" type="password" autoComplete="new-password" value={again} onChange={(e) => setAgain(e.target.value)} />
      <ErrorNote error={error} />
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Saving…' : submitLabel}
      </Button>
    </form>
  );
}
