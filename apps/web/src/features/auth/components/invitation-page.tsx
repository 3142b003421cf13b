import { useNavigate, useParams } from 'react-router-dom';
import { useAcceptInvitation } from '../api/accept-invitation';
import { AuthCard } from '@/components/ui/auth-card';
import { SetPasswordForm } from './set-password-form';

/** From the invitation e-mail: the invited person chooses a password and is signed in. */
export default function InvitationPage() {
  const { token = '' } = useParams();
  const accept = useAcceptInvitation();
  const navigate = useNavigate();
  return (
    <AuthCard title="Welcome to Splitscope" subtitle="Choose your password to join your shop's bench">
      <SetPasswordForm
        submitLabel="Set my password and sign in"
        pending={accept.isPending}
        error={accept.error}
        onSubmit={(password) => accept.mutate({ token, password }, { onSuccess: () => void navigate('/', { replace: true }) })}
      />
    </AuthCard>
  );
}
