import { ROLES, type Role } from '../../../../shared/schemas/common.schema.ts';
import type { z } from 'zod';
import type { memberSchema } from '../../../../shared/schemas/team.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { useChangeRole, useRemoveMember } from '../api/team.ts';

type Member = z.infer<typeof memberSchema>;

export function MemberTable({ orgId, members, isOwner, myId }: { orgId: string; members: Member[]; isOwner: boolean; myId: string }) {
  const changeRole = useChangeRole(orgId);
  const remove = useRemoveMember(orgId);
  const failure = changeRole.error ?? remove.error;
  return (
    <div className="space-y-2">
      <table className="w-full rounded-lg border border-line bg-white text-left text-sm">
        <thead className="bg-tide-50 text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">Name</th>
            <th scope="col" className="px-3 py-2">E-mail</th>
            <th scope="col" className="px-3 py-2">Role</th>
            {isOwner && <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>}
          </tr>
        </thead>
        <tbody>
          {members.map((m) => (
            <tr key={m.userId} className="border-t border-line">
              <td className="px-3 py-2">{m.displayName}</td>
              <td className="px-3 py-2">{m.email}</td>
              <td className="px-3 py-2">
                {isOwner ? (
                  <select
                    aria-label={`Role of ${m.displayName}`}
                    className="rounded border border-line px-2 py-1"
                    value={m.role}
                    onChange={(e) => changeRole.mutate({ userId: m.userId, role: e.target.value as Role })}
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r}>{r}</option>
                    ))}
                  </select>
                ) : (
                  m.role
                )}
              </td>
              {isOwner && (
                <td className="px-3 py-2 text-right">
                  {m.userId !== myId && (
                    <Button variant="secondary" onClick={() => window.confirm(`Remove ${m.displayName} from the organisation?`) && remove.mutate(m.userId)}>
                      Remove
                    </Button>
                  )}
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
      {failure && <p role="alert" className="text-sm text-alarm-600">{failure.message}</p>}
    </div>
  );
}
