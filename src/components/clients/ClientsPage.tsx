import Caseload from './Caseload';
import ClientList from './ClientList';

/** Staff get the clinic's caseload; carers and clients the people they are linked to. */
export default function ClientsPage({ staff }: { staff: boolean }) {
  return staff ? <Caseload /> : <ClientList />;
}
