import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { ErrorNote, TextField } from '@/components/ui/text-field';
import { useRequestPasswordReset } from '../api/request-password-reset';
import { AuthCard } from '@/components/ui/auth-card';

export default function ForgotPasswordPage() {
  const [email, setEmail] = useState('');
  const request = useRequestPasswordReset();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    request.mutate({ email });
  };
  return (
    <AuthCard title="Forgot your password?" subtitle="We e-mail you a link to choose a new one">
      {request.isSuccess ? (
        <p role="status" className="rounded-md bg-green-50 p-3">
          If {email} has an account, a link is on its way. It works once, for 30 minutes.
        </p>
      ) : (
        <form onSubmit={submit} noValidate className="space-y-4">
          <TextField label="E-mail" type="email" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} />
          <ErrorNote error={request.error} />
          <Button type="submit" disabled={request.isPending} className="w-full">
            {request.isPending ? 'Sending…' : 'Send the link'}
          </Button>
        </form>
      )}
      <p className="mt-4 text-sm">
        <Link to="/sign-in" className="underline">
          Back to sign-in
        </Link>
      </p>
    </AuthCard>
  );
}
