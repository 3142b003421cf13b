import { Link, useNavigate, useParams } from 'react-router-dom';
import { AuthCard } from '@/components/ui/auth-card';
import { useSetPasswordFromLink, type PasswordLink } from '../api/password-link';
import { SetPasswordForm } from './set-password-form';

const WORDS: Record<PasswordLink, { title: string; subtitle: string; submit: string }> = {
  invitation: { title: 'Welcome to Splitscope', subtitle: "Choose your password to join your shop's bench", submit: 'Set my password and sign in' },
  reset: { title: 'Choose a new password', subtitle: 'Your other sessions will be signed out', submit: 'Save and sign in' },
};

/**
 * From the invitation e-mail (the invited person chooses a password) or the reset e-mail (single use, 30 minutes;
 * every other session ends): one form, and the person is signed in.
 */
export default function PasswordLinkPage({ link }: { link: PasswordLink }) {
  const { token = '' } = useParams();
  const save = useSetPasswordFromLink(link);
  const navigate = useNavigate();
  const w = WORDS[link];
  return (
    <AuthCard title={w.title} subtitle={w.subtitle}>
      <SetPasswordForm
        submitLabel={w.submit}
        pending={save.isPending}
        error={save.error}
        onSubmit={(password) => save.mutate({ token, password }, { onSuccess: () => void navigate('/', { replace: true }) })}
      />
      {link === 'reset' && (
        <p className="mt-4 text-sm">
          Link expired?{' '}
          <Link to="/forgot-password" className="underline">
            Ask for a new one
          </Link>
          .
        </p>
      )}
    </AuthCard>
  );
}
