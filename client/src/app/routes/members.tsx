import { MembersScreen } from '@client/features/members/components/members-screen';

export default function MembersRoute() {
  return <MembersScreen />;
}
