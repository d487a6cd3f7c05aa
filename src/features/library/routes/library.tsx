import { EmptyState, PageTitle } from '../../../components/page-title';
import { useTeamRole } from '../../auth/use-team-role';

export function LibraryRoute() {
  const { can } = useTeamRole();
  return (
    <>
      <PageTitle title="Art library" />
      <EmptyState title="Your shelf is empty">
        {can('library.contribute')
          ? 'Clip art you upload lands here, ready to become stickers: keywords, collections and licences keep it findable.'
          : 'Your role can browse the team’s art here once teammates add some.'}
      </EmptyState>
    </>
  );
}
