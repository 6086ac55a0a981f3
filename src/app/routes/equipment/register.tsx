import { useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { EQUIPMENT_KINDS } from '@shared/domain/limits';
import { EQUIPMENT_KIND_LABELS, EQUIPMENT_STATUS_LABELS, EQUIPMENT_STATUSES } from '@shared/schemas/equipment';
import { useMe } from '@/features/auth/api/get-me';
import { useEquipmentList, type EquipmentFilter } from '@/features/equipment/api/get-equipment-list';
import { useCreateEquipment } from '@/features/equipment/api/create-equipment';
import { EquipmentTable } from '@/features/equipment/components/equipment-table';
import { EquipmentCreateForm } from '@/features/equipment/components/equipment-form';
import { LabelScanner, type CodeHandler } from '@/features/labels/components/label-scanner';
import { registerLabelsUrl } from '@/features/labels/api/label-sheets';
import { resolveCode } from '@/features/labels/utils/strip-for-code';
import { Button } from '@/components/ui/button';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';

export default function EquipmentRegisterPage() {
  const me = useMe();
  const [filter, setFilter] = useState<EquipmentFilter>({});
  const list = useEquipmentList(filter);
  const create = useCreateEquipment();
  const canManage = me.data?.role === 'admin' || me.data?.role === 'director';
  const navigate = useNavigate();
  const [scanning, setScanning] = useState(false);
  const [scannedTag, setScannedTag] = useState<string>();
  // A known tag opens its item; an unknown one goes into the form to register it.
  const onCode: CodeHandler = async (code) => {
    const found = await resolveCode(code);
    if (found.kind === 'strip') return 'That is a strip’s label: scan the label of an item.';
    if (found.kind === 'item') {
      setScanning(false);
      navigate(paths.equipmentItem(found.item.equipmentId));
      return undefined;
    }
    if (!canManage) return `No item in the register has the tag ${found.assetTag}.`;
    setScanning(false);
    setScannedTag(found.assetTag);
    return undefined;
  };

  return (
    <>
      {scanning && (
        <LabelScanner
          title="Find an item by its label"
          hint={
            canManage
              ? 'Point the camera at an item’s label: a known tag opens the item, a new one goes into the form to register it.'
              : 'Point the camera at an item’s label to open the item.'
          }
          onClose={() => setScanning(false)}
          onCode={onCode}
        />
      )}
      <PageHeader
        title="Equipment register"
        subtitle={
          canManage
            ? 'Every tagged item of the organisation, with its history across events.'
            : 'Every tagged item of the organisation (read only for your role).'
        }
        actions={
          <>
            <Button variant="secondary" onClick={() => setScanning(true)}>
              Scan a label
            </Button>
            {canManage && (
              <a
                href={registerLabelsUrl(filter)}
                target="_blank"
                rel="noreferrer"
                className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium hover:bg-paper"
              >
                Print labels
              </a>
            )}
            <a
              href={paths.equipmentCsv}
              download
              className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium hover:bg-paper"
            >
              Export CSV
            </a>
            {canManage && (
              <Link
                to={paths.equipmentImport}
                className="inline-flex min-h-touch items-center rounded-lg bg-brand px-4 font-medium text-white hover:bg-brand/90"
              >
                Import from a spreadsheet
              </Link>
            )}
          </>
        }
      />
      <div className={`grid gap-6 ${canManage ? 'lg:grid-cols-[2fr_1fr]' : ''}`}>
        <div className="flex flex-col gap-4">
          <Card className="grid gap-3 sm:grid-cols-3">
            <TextField
              label="Search"
              name="q"
              placeholder="Tag, description or cable type"
              value={filter.q ?? ''}
              onChange={(e) => setFilter({ ...filter, q: e.target.value })}
            />
            <SelectField
              label="Kind"
              name="kind"
              value={filter.kind ?? ''}
              onChange={(e) => setFilter({ ...filter, kind: e.target.value })}
            >
              <option value="">All kinds</option>
              {EQUIPMENT_KINDS.map((k) => (
                <option key={k} value={k}>
                  {EQUIPMENT_KIND_LABELS[k]}
                </option>
              ))}
            </SelectField>
            <SelectField
              label="Status"
              name="status"
              value={filter.status ?? ''}
              onChange={(e) => setFilter({ ...filter, status: e.target.value })}
            >
              <option value="">Any status</option>
              {EQUIPMENT_STATUSES.map((s) => (
                <option key={s} value={s}>
                  {EQUIPMENT_STATUS_LABELS[s]}
                </option>
              ))}
            </SelectField>
          </Card>
          <Card className="overflow-x-auto p-0!">
            {list.isPending && <Loading />}
            {list.isError && <Notice tone="error">{list.error.message}</Notice>}
            {list.data && (
              <>
                <p className="border-b border-line px-4 py-2 text-sm text-ink-soft">{list.data.length} items</p>
                <EquipmentTable items={list.data} itemHref={paths.equipmentItem} system={me.data?.unitSystem ?? 'metric'} />
              </>
            )}
          </Card>
        </div>
        {canManage && (
          <Card className="self-start">
            <h2 className="text-lg font-semibold">Register an item</h2>
            <p className="mb-4 mt-1 text-sm text-ink-soft">
              The asset tag is what is printed on the item; it is unique in your organisation.
            </p>
            {scannedTag && <Notice tone="info">No item has the tag {scannedTag} yet: it is filled in below to register it.</Notice>}
            <EquipmentCreateForm onCreate={(v) => create.mutateAsync(v)} scannedTag={scannedTag} />
          </Card>
        )}
      </div>
    </>
  );
}
