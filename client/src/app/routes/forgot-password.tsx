import { Link } from 'react-router';
import { paths } from '@client/config/paths';
import { AuthCard } from '@client/features/auth/components/auth-card';
import { ForgotPasswordForm } from '@client/features/auth/components/forgot-password-form';

export default function ForgotPasswordRoute() {
  return (
    <AuthCard title="Forgotten password" intro="Enter your e-mail address and we send a link to choose a new password. The link works once, for one hour.">
      <ForgotPasswordForm />
      <p className="mt-4">
        <Link to={paths.signIn} className="inline-flex min-h-touch items-center font-bold text-sea underline">
          Back to sign-in
        </Link>
      </p>
    </AuthCard>
  );
}
