import { EmptyState, PageTitle } from '../../../components/page-title';
import { useTeamRole } from '../../auth/use-team-role';

export function SheetsRoute() {
  const { can } = useTeamRole();
  return (
    <>
      <PageTitle title="Sheets" />
      <EmptyState title="No sheets yet">
        {can('sheets.edit')
          ? 'A sheet is one print-and-cut page: pieces with white borders and cut lines, packed inside your cutter’s print area.'
          : 'Sheets your team lays out will be listed here.'}
      </EmptyState>
    </>
  );
}
