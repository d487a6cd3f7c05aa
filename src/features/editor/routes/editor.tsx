import { EmptyState, PageTitle } from '../../../components/page-title';

export function EditorRoute() {
  return (
    <>
      <PageTitle title="Sheet editor" />
      <EmptyState title="The layout bench is being built">
        This is where pieces will be placed at true size on the cutter’s print area.
      </EmptyState>
    </>
  );
}
