import { Link } from 'react-router';
import { ImportWizard } from '@/features/equipment-import/components/import-wizard';
import { PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

export default function EquipmentImportPage() {
  return (
    <>
      <PageHeader
        title="Import the register from a spreadsheet"
        subtitle="Bring in the cable inventory you already keep: check every row before anything is written."
        actions={
          <>
            <a
              href={paths.equipmentCsv}
              className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium hover:bg-paper"
              download
            >
              Export CSV
            </a>
            <Link
              to={paths.equipment}
              className="inline-flex min-h-touch items-center rounded-lg px-4 font-medium text-brand hover:bg-brand-soft"
            >
              Back to the register
            </Link>
          </>
        }
      />
      <ImportWizard itemHref={paths.equipmentItem} />
    </>
  );
}
