import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { organisationInputSchema } from '../../../shared/schemas/team.schema.ts';
import { Button } from '../../components/ui/button.tsx';
import { TextField } from '../../components/ui/field.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useCreateOrganisation } from '../../features/account/api/create-organisation.ts';
import { useMe } from '../../features/account/api/get-me.ts';

export function CreateOrganisationForm() {
  const [name, setName] = useState('');
  const [error, setError] = useState<string>();
  const create = useCreateOrganisation();
  const navigate = useNavigate();
  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = organisationInputSchema.safeParse({ name });
    if (!parsed.success) return setError(parsed.error.issues[0]?.message);
    setError(undefined);
    create.mutate(parsed.data.name, { onSuccess: (org) => org && navigate(`/o/${org.id}`) });
  }
  return (
    <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-3">
      <TextField label="Organisation name" value={name} onChange={(e) => setName(e.target.value)} error={error ?? create.error?.message} />
      <Button type="submit" disabled={create.isPending}>Create organisation</Button>
    </form>
  );
}

export default function AccountRoute() {
  const me = useMe();
  return (
    <QueryState query={me}>
      {(data) => (
        <div className="space-y-8">
          <PageHeader title="Your account">
            <a href="/auth/logout" className="rounded-md border border-tide-700 px-4 py-2 text-sm font-semibold text-tide-700">Sign out</a>
          </PageHeader>
          <section>
            <p className="font-semibold">{data.displayName}</p>
            <p className="text-sm text-ink-soft">{data.email}</p>
          </section>
          <section aria-labelledby="orgs">
            <h2 id="orgs" className="mb-2 text-lg font-bold">Organisations</h2>
            <ul className="mb-4 divide-y divide-line rounded-lg border border-line bg-white">
              {data.memberships.map((m) => (
                <li key={m.organisationId} className="px-3 py-2 text-sm">
                  <Link className="font-semibold text-tide-700 underline" to={`/o/${m.organisationId}`}>{m.organisationName}</Link> · {m.role}
                </li>
              ))}
              {data.memberships.length === 0 && <li className="px-3 py-2 text-sm text-ink-soft">None yet.</li>}
            </ul>
            <CreateOrganisationForm />
          </section>
        </div>
      )}
    </QueryState>
  );
}
