import { useState, type FormEvent } from 'react';
import type { Role } from '../../../../shared/schemas/common.schema.ts';
import { invitationInputSchema } from '../../../../shared/schemas/team.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { useInvite } from '../api/team.ts';

export function InviteForm({ orgId, myRole }: { orgId: string; myRole: Role }) {
  const grantable: Role[] = myRole === 'owner' ? ['crew', 'biologist', 'manager', 'owner'] : ['crew', 'biologist'];
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('crew');
  const [error, setError] = useState<string>();
  const invite = useInvite(orgId);

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = invitationInputSchema.safeParse({ email, role });
    if (!parsed.success) return setError(parsed.error.issues[0]?.message);
    setError(undefined);
    invite.mutate(parsed.data, { onSuccess: () => setEmail('') });
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-3">
      <TextField label="E-mail" type="email" value={email} onChange={(e) => setEmail(e.target.value)} error={error} />
      <SelectField label="Role" value={role} onChange={(e) => setRole(e.target.value as Role)}>
        {grantable.map((r) => (
          <option key={r} value={r}>{r}</option>
        ))}
      </SelectField>
      <Button type="submit" disabled={invite.isPending}>{invite.isPending ? 'Sending…' : 'Send invitation'}</Button>
      {invite.error && <p role="alert" className="w-full text-sm text-alarm-600">{invite.error.message}</p>}
      {invite.isSuccess && <p role="status" className="w-full text-sm text-kelp-500">Invitation sent. The link works once and expires in 7 days.</p>}
    </form>
  );
}
