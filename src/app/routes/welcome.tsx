import { PageHeader } from '../../components/ui/page-header.tsx';
import { CreateOrganisationForm } from './account.tsx';

export default function WelcomeRoute() {
  return (
    <div className="max-w-2xl space-y-4">
      <PageHeader title="Welcome to Planktide" />
      <p className="text-ink-soft">
        You are not in an organisation yet. If someone invited you, open the link in their e-mail. Otherwise create your farm business
        here; you become its owner and can invite your team.
      </p>
      <CreateOrganisationForm />
    </div>
  );
}
