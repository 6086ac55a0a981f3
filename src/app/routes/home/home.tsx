import { useMe } from '@/features/auth/api/get-me';
import { PageHeader } from '@/components/ui/card';
import { homeSections } from './home-sections';
import { ROLE_LABELS } from '@shared/schemas/common';

/** Each role lands on its own home: technicians their venues, directors and organisers their events. */
export default function HomePage() {
  const me = useMe();
  if (!me.data) return null;
  const Section = homeSections[me.data.role];
  const titles = {
    technician: 'My venues',
    director: 'Our events and venues',
    organiser: 'Our events and venues',
    admin: 'People and equipment',
  };
  return (
    <>
      <PageHeader title={titles[me.data.role]} subtitle={`Signed in as ${me.data.name} (${ROLE_LABELS[me.data.role].toLowerCase()})`} />
      <Section />
    </>
  );
}
