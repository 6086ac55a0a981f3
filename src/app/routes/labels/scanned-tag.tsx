import { useQuery } from '@tanstack/react-query';
import { Link, Navigate, useParams } from 'react-router';
import { parseScannedCode } from '@shared/domain/label-codes';
import { useMe } from '@/features/auth/api/get-me';
import { resolveCode } from '@/features/labels/utils/strip-for-code';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

/**
 * An item's label read by any camera app: those who test go to the strip it sits on (when there is
 * one), everyone else, or an item on no strip of theirs, to the item in the register.
 */
export default function ScannedTagPage() {
  const { tag = '' } = useParams();
  const me = useMe();
  const code = parseScannedCode(tag);
  const found = useQuery({ queryKey: ['scanned-tag', tag], queryFn: () => resolveCode(code!), enabled: code?.kind === 'tag' });
  if (!code || code.kind !== 'tag') return <Notice tone="error">“{tag}” is not an asset tag.</Notice>;
  if (found.isPending || me.isPending) return <Loading />;
  if (found.isError) return <Notice tone="error">{found.error.message}</Notice>;
  const outcome = found.data;
  if (outcome.kind === 'unknown-tag') return <Notice tone="error">No item in the register has the tag {outcome.assetTag}.</Notice>;
  if (outcome.kind === 'strip') return <Navigate replace to={paths.stripTest(outcome.stripId)} />;
  const { item } = outcome;
  const tests = me.data?.role === 'technician' || me.data?.role === 'director';
  if (!tests || item.placements.length === 0) return <Navigate replace to={paths.equipmentItem(item.equipmentId)} />;
  if (item.placements.length === 1) return <Navigate replace to={paths.stripTest(item.placements[0]!.stripId)} />;
  return (
    <>
      <PageHeader title={item.assetTag} subtitle="This item is on strips of more than one venue. Choose the one you are testing." />
      <Card>
        <ul className="flex flex-col gap-2">
          {item.placements.map((p) => (
            <li key={p.stripId}>
              <Link className="text-brand underline" to={paths.stripTest(p.stripId)}>
                {p.stripLabel} · {p.position} — {p.venueName}, {p.eventName}
              </Link>
            </li>
          ))}
          <li>
            <Link className="text-brand underline" to={paths.equipmentItem(item.equipmentId)}>
              The item in the register
            </Link>
          </li>
        </ul>
      </Card>
    </>
  );
}
