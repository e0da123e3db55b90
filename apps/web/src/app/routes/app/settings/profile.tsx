import { Card } from '../../../../components/ui/card';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { ProfileForm } from '../../../../features/auth/components/profile-form';

export function ProfileRoute() {
  const me = useSignedInMe();
  return (
    <Card title="Profile" description="Your name as others in the shop see it, and the units you read numbers in.">
      <ProfileForm me={me} />
    </Card>
  );
}
