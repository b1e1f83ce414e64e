import Caseload from './Caseload';
import ClientList from './ClientList';

/** Staff get the clinic's caseload; carers and clients the people they are linked to. */
export default function ClientsPage({ staff, locale }: { staff: boolean; locale: string }) {
  return staff ? <Caseload locale={locale} /> : <ClientList />;
}
