import { Navigate, useParams } from 'react-router';
import { paths } from '@/config/paths';

/** A strip's label read by any camera app: its testing screen (which says so if the strip is not the reader's). */
export default function ScannedStripPage() {
  const { stripId = '' } = useParams();
  return <Navigate replace to={paths.stripTest(stripId)} />;
}
