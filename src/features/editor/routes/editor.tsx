import { useParams } from 'react-router';
import { FormMessage } from '@/components/form';
import { useTeamRole } from '@/features/auth/use-team-role';
import { useSheet } from '../api/sheet';
import { EditorPage } from '../ui/editor-page';

export function EditorRoute() {
  const { sheetId = '' } = useParams();
  const { teamId, can } = useTeamRole();
  const sheet = useSheet(teamId!, sheetId);
  if (sheet.isPending) return <p>Opening the sheet…</p>;
  if (sheet.isError) return <FormMessage>{sheet.error.message}</FormMessage>;
  return <EditorPage key={sheet.data.id} teamId={teamId!} sheet={sheet.data} canEdit={can('sheets.edit')} />;
}
