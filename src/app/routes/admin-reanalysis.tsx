import { AdminPage } from '@/features/admin/components/admin-page';
import { ReanalysisPanel } from '@/features/admin/components/reanalysis-panel';

export function AdminReanalysisRoute() {
  return (
    <AdminPage
      title="Re-analysis"
      intro="When the comparison method changes, every stored ride can be analysed again with it. Decisions stay; the statistics are rebuilt once at the end."
    >
      <ReanalysisPanel />
    </AdminPage>
  );
}
