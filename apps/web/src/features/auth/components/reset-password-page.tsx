import { Link, useNavigate, useParams } from 'react-router-dom';
import { useConfirmPasswordReset } from '../api/confirm-password-reset';
import { AuthCard } from '@/components/ui/auth-card';
import { SetPasswordForm } from './set-password-form';

/** From the reset e-mail (single use, 30 minutes): a new password; every other session ends. */
export default function ResetPasswordPage() {
  const { token = '' } = useParams();
  const confirm = useConfirmPasswordReset();
  const navigate = useNavigate();
  return (
    <AuthCard title="Choose a new password" subtitle="Your other sessions will be signed out">
      <SetPasswordForm
        submitLabel="Save and sign in"
        pending={confirm.isPending}
        error={confirm.error}
        onSubmit={(password) => confirm.mutate({ token, password }, { onSuccess: () => void navigate('/', { replace: true }) })}
      />
      <p className="mt-4 text-sm">
        Link expired? <Link to="/forgot-password" className="underline">Ask for a new one</Link>.
      </p>
    </AuthCard>
  );
}
