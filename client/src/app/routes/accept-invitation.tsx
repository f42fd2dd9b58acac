import { Link, useLocation, useNavigate } from 'react-router';
import { EmailTokenSchema, ROLE_LABELS } from '@shared/api/auth';
import { paths } from '@client/config/paths';
import { AuthCard } from '@client/features/auth/components/auth-card';
import { AcceptInvitationForm } from '@client/features/auth/components/accept-invitation-form';
import { useInvitation } from '@client/features/auth/api/invitation';

export default function AcceptInvitationRoute() {
  const { hash } = useLocation();
  const navigate = useNavigate();
  const token = hash.replace(/^#/, '');
  const valid = EmailTokenSchema.safeParse(token).success;
  const invitation = useInvitation(valid ? token : '');

  if (!valid || invitation.isError) {
    return (
      <AuthCard title="Invitation">
        <p data-testid="invitation-problem">
          {invitation.error?.message ?? 'This link is not complete. Open it again from the e-mail.'}
        </p>
        <Link to={paths.signIn} className="mt-3 inline-flex min-h-touch items-center font-bold text-sea underline">
          Go to sign-in
        </Link>
      </AuthCard>
    );
  }
  if (!invitation.data) {
    return (
      <AuthCard title="Invitation">
        <p role="status">Opening the invitation…</p>
      </AuthCard>
    );
  }
  const inv = invitation.data;
  return (
    <AuthCard
      title={`Join ${inv.organisation.name}`}
      intro={
        <>
          {inv.invitedBy ? `${inv.invitedBy.name} invited ` : 'You are invited as '}
          <strong>{inv.email}</strong>
          {inv.invitedBy ? ' as ' : ', '}
          {ROLE_LABELS[inv.role].toLowerCase()}. Choose your name and a password.
        </>
      }
    >
      <AcceptInvitationForm token={token} onAccepted={() => navigate(paths.surveys, { replace: true })} />
    </AuthCard>
  );
}
