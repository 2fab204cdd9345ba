import { formatDate } from '../../../../shared/format';
import type { TeamMember } from '../../../../shared/schemas/team';
import type { Role } from '../../../../shared/roles';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage } from '../../../lib/form';
import { useUpdateMember } from '../api';
import { roleOptions } from '../roles';

/** The team with inline role changes and (de)activation; the server refuses lock-outs with a message shown above the table. */
export function TeamTable({ members, meId }: { members: TeamMember[]; meId: number }) {
  const update = useUpdateMember();
  return (
    <div className="space-y-3">
      <FormAlert message={formMessage(update.error)} />
      {/* relative: the sr-only role labels are absolutely placed, and would otherwise escape the scroll box and widen the page on a phone. */}
      <div className="relative overflow-x-auto rounded-lg border border-rule bg-sheet">
        <table className="w-full text-sm">
          <thead className="bg-paper text-left text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 font-medium">
                Name
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                E-mail
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Role
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Status
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Joined
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {members.map((m) => (
              <tr
                key={m.id}
                className={`border-t border-rule ${m.active ? '' : 'text-ink-faint'}`}
                data-testid={`member-${m.email}`}
              >
                <th scope="row" className="px-3 py-2 text-left font-medium">
                  {m.name}
                  {m.id === meId ? <span className="ml-1 text-xs text-ink-faint">(you)</span> : null}
                </th>
                <td className="px-3 py-2 font-mono text-xs">{m.email}</td>
                <td className="px-3 py-2">
                  <label className="sr-only" htmlFor={`role-${m.id}`}>
                    Role of {m.name}
                  </label>
                  <select
                    id={`role-${m.id}`}
                    value={m.role}
                    disabled={update.isPending}
                    onChange={(e) => update.mutate({ id: m.id, role: e.target.value as Role })}
                    className="rounded-md border border-rule-strong bg-sheet px-2 py-1"
                  >
                    {roleOptions.map((o) => (
                      <option key={o.value} value={o.value}>
                        {o.label}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="px-3 py-2">{m.active ? 'Active' : 'Deactivated'}</td>
                <td className="px-3 py-2 num whitespace-nowrap">
                  <time dateTime={m.createdAt}>{formatDate(m.createdAt)}</time>
                </td>
                <td className="px-3 py-2 text-right">
                  {m.id === meId ? null : (
                    <button
                      type="button"
                      disabled={update.isPending}
                      onClick={() => update.mutate({ id: m.id, active: !m.active })}
                      className={`rounded-md border px-3 py-1 ${m.active ? 'border-danger text-danger hover:bg-danger-tint' : 'border-rule-strong hover:bg-paper'}`}
                    >
                      {m.active ? `Deactivate` : `Reactivate`}
                      <span className="sr-only"> {m.name}</span>
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
