import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router';
import { SHEET_STATUS_LABELS, SHEET_STATUSES } from '@shared/schemas/sheets';
import { Button, FormMessage } from '@/components/form';
import { EmptyState, PageTitle } from '@/components/page-title';
import { useAction } from '@/hooks/use-action';
import { useMe } from '@/features/auth/api/me';
import { useTeamRole } from '@/features/auth/use-team-role';
import { useCreateSheet, useDeleteSheet, useDuplicateSheet, useProfiles, useSheets } from '../api/sheets';
import { ProfilesPanel } from '../components/profiles-panel';

const input = 'rounded-lg border-2 border-paper-edge bg-white px-2 py-1 text-sm';

export function SheetsRoute() {
  const { teamId, can } = useTeamRole();
  const { data: me } = useMe();
  const [q, setQ] = useState('');
  const [status, setStatus] = useState('');
  const [ownerId, setOwnerId] = useState('');
  const start = useForm({ defaultValues: { name: '', profileId: '' } });
  const { error, run } = useAction();
  const sheets = useSheets(teamId!, { q, status, ownerId });
  const owners = [...new Map((sheets.data ?? []).map((s) => [s.owner.id, s.owner.name])).entries()];
  const templates = useSheets(teamId!, { templates: 'only' });
  const profiles = useProfiles(teamId!);
  const create = useCreateSheet(teamId!);
  const duplicate = useDuplicateSheet(teamId!);
  const remove = useDeleteSheet(teamId!);
  const navigate = useNavigate();
  const edit = can('sheets.edit');

  const open = (id: string) => navigate(`/t/${teamId}/sheets/${id}`);

  return (
    <>
      <PageTitle title="Sheets" />
      <FormMessage>{error}</FormMessage>
      <div className="grid gap-6 xl:grid-cols-[1fr_22rem]">
        <div className="min-w-0">
          {edit && (
            <form
              className="mb-4 flex flex-wrap items-end gap-2 rounded-sticker border-2 border-paper-edge bg-white p-4"
              onSubmit={start.handleSubmit(
                ({ name, profileId }) =>
                  void run(async () =>
                    open(
                      (
                        await create.mutateAsync({
                          name: name.trim() || 'Untitled sheet',
                          profileId: profileId || undefined,
                          unit: me?.user.unit,
                        })
                      ).id,
                    ),
                  ),
              )}
            >
              <label className="flex flex-1 flex-col gap-1 text-sm font-bold">
                New sheet
                <input {...start.register('name')} placeholder="e.g. Spring market, sheet 1" className={`${input} font-normal`} />
              </label>
              <label className="flex flex-col gap-1 text-sm font-bold">
                Profile
                <select {...start.register('profileId')} className={`${input} font-normal`}>
                  {profiles.data?.map((p) => (
                    <option key={p.id} value={p.isDefault ? '' : p.id}>
                      {p.name}
                    </option>
                  ))}
                </select>
              </label>
              <Button type="submit" busy={create.isPending}>
                Start sheet
              </Button>
            </form>
          )}
          <div className="mb-3 flex flex-wrap gap-2" role="search">
            <input
              type="search"
              aria-label="Find sheets"
              placeholder="Find sheets by name"
              value={q}
              onChange={(e) => setQ(e.target.value)}
              className={`${input} flex-1`}
            />
            <select aria-label="Status" value={status} onChange={(e) => setStatus(e.target.value)} className={input}>
              <option value="">Any status</option>
              {SHEET_STATUSES.map((s) => (
                <option key={s} value={s}>
                  {SHEET_STATUS_LABELS[s]}
                </option>
              ))}
            </select>
            <select aria-label="Owner" value={ownerId} onChange={(e) => setOwnerId(e.target.value)} className={input}>
              <option value="">Anyone’s</option>
              {owners.map(([id, n]) => (
                <option key={id} value={id}>
                  {n}
                </option>
              ))}
            </select>
          </div>
          {sheets.data?.length === 0 ? (
            <EmptyState title="No sheets yet">
              A sheet is one print-and-cut page: pieces with borders and cut lines inside your cutter’s print area.
            </EmptyState>
          ) : (
            <table className="w-full rounded-sticker bg-white text-sm [&_td]:pr-3 [&_th]:pr-3" data-testid="sheets-table">
              <thead className="text-left text-ink-soft">
                <tr>
                  <th className="p-2">
                    <span className="sr-only">Preview</span>
                  </th>
                  <th>Name</th>
                  <th>Pieces</th>
                  <th>Area used</th>
                  <th>Cost / sheet</th>
                  <th>Status</th>
                  <th>Updated</th>
                  <th>Owner</th>
                  <th>Export</th>
                  <th>
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {sheets.data?.map((s) => (
                  <tr key={s.id} className="border-t border-paper-deep">
                    <td className="p-2">
                      {s.thumbnailUrl ? (
                        <img src={s.thumbnailUrl} alt="" className="h-14 w-11 rounded border border-paper-edge object-contain" />
                      ) : (
                        <div className="h-14 w-11 rounded border border-dashed border-paper-edge" />
                      )}
                    </td>
                    <td>
                      <Link to={s.id} className="font-bold underline">
                        {s.name}
                      </Link>
                      {s.forSale && <span className="ml-2 rounded-full bg-peel-light px-2 text-xs text-peel-deep">for sale</span>}
                    </td>
                    <td>{s.pieceCount}</td>
                    <td>{Math.round(s.areaUsed * 100)} %</td>
                    <td
                      className="text-xs"
                      data-testid="sheet-cost"
                      title={s.cost && !s.cost.current ? 'Worked out for an earlier version' : undefined}
                    >
                      {s.cost && !s.cost.priced
                        ? 'Not priced yet'
                        : s.cost
                          ? `${s.cost.current ? '' : '≈ '}${s.cost.currency}${s.cost.sheet.toFixed(2)}${s.cost.perSticker !== null ? ` (${s.cost.currency}${s.cost.perSticker.toFixed(2)} each)` : ''}`
                          : '—'}
                    </td>
                    <td>{SHEET_STATUS_LABELS[s.status]}</td>
                    <td>{new Date(s.updatedAt).toLocaleDateString()}</td>
                    <td>{s.owner.name}</td>
                    <td className="text-xs">
                      {s.lastExport?.status === 'running' && (
                        <progress max={1} value={s.lastExport.progress} className="h-2 w-16" aria-label="Export progress" />
                      )}
                      {s.lastExport?.downloadUrl && (
                        <a href={s.lastExport.downloadUrl} className="font-bold underline">
                          {s.lastExport.current ? 'Download' : 'Older version'}
                        </a>
                      )}
                      {s.lastExport?.status === 'failed' && <span className="text-alarm">Failed</span>}
                    </td>
                    <td className="whitespace-nowrap text-right">
                      {edit && (
                        <>
                          <button
                            type="button"
                            className="mr-2 font-bold underline"
                            onClick={() => run(async () => open((await duplicate.mutateAsync({ id: s.id })).id))}
                          >
                            Duplicate
                          </button>
                          <button
                            type="button"
                            className="mr-2 font-bold underline"
                            onClick={() => run(() => duplicate.mutateAsync({ id: s.id, name: `${s.name} (template)`, asTemplate: true }))}
                          >
                            Save as template
                          </button>
                          <button
                            type="button"
                            className="font-bold text-alarm underline"
                            onClick={() => window.confirm(`Delete the sheet “${s.name}”?`) && run(() => remove.mutateAsync(s.id))}
                          >
                            Delete
                          </button>
                        </>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </div>
        <div className="flex flex-col gap-4">
          {templates.data && templates.data.length > 0 && (
            <section className="rounded-sticker border-2 border-paper-edge bg-white p-5 text-sm">
              <h2 className="mb-2 text-lg font-extrabold">Templates</h2>
              <ul className="flex flex-col gap-2">
                {templates.data.map((t) => (
                  <li key={t.id} className="flex items-center justify-between gap-2">
                    <span>
                      {t.name} · {t.pieceCount} pieces
                    </span>
                    {edit && (
                      <button
                        type="button"
                        className="font-bold underline"
                        onClick={() =>
                          run(async () =>
                            open((await create.mutateAsync({ name: t.name.replace(/ \(template\)$/, ''), fromTemplateId: t.id })).id),
                          )
                        }
                      >
                        Use
                      </button>
                    )}
                  </li>
                ))}
              </ul>
            </section>
          )}
          <ProfilesPanel teamId={teamId!} profiles={profiles.data ?? []} unit={me?.user.unit ?? 'in'} canManage={can('team.settings')} />
        </div>
      </div>
    </>
  );
}
