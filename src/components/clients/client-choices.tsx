// The clients a form may be for (upload, checks). A carer has one or two and
// sees them all; a clinic of a thousand gets the first 200 by name and a
// search that asks the server, so no page ever carries the whole caseload.
import { useEffect, useState } from 'react';
import { useApi, type Loadable } from '../api';
import { TextField } from '../ui/Field';

// The most /api/clients sends at once.
const CHOICES = 200;
const SEARCH_PAUSE_MS = 300;

interface ClientPage<T> {
  clients: T[];
  total: number;
}

export interface ClientChoices<T> {
  value: Loadable<{ clients: T[]; total: number }>;
  reload: () => void;
  /** More clients than one answer holds: the form shows a search. */
  searchable: boolean;
  search: string;
  setSearch: (s: string) => void;
}

/**
 * The choices for a form. The client the page was opened for (`?clientId=`)
 * stays among them whatever the search, so the form never loses it.
 */
export function useClientChoices<T extends { id: string }>(initialClientId: string | null): ClientChoices<T> {
  const [search, setSearch] = useState('');
  const [asked, setAsked] = useState('');
  useEffect(() => {
    const t = setTimeout(() => setAsked(search.trim()), SEARCH_PAUSE_MS);
    return () => clearTimeout(t);
  }, [search]);
  const [page, reload] = useApi<ClientPage<T>>(`/api/clients?limit=${CHOICES}${asked ? `&q=${encodeURIComponent(asked)}` : ''}`);
  const [searchable, setSearchable] = useState(false);
  useEffect(() => {
    if (page.state === 'ready' && !asked && page.data.total > page.data.clients.length) setSearchable(true);
  }, [page, asked]);
  const missing = page.state === 'ready' && initialClientId !== null && !page.data.clients.some((c) => c.id === initialClientId);
  const [initial] = useApi<T>(missing ? `/api/clients/${initialClientId}` : null);
  const value: ClientChoices<T>['value'] =
    page.state !== 'ready'
      ? page
      : { state: 'ready', data: { clients: missing && initial.state === 'ready' ? [initial.data, ...page.data.clients] : page.data.clients, total: page.data.total } };
  return { value, reload, searchable, search, setSearch };
}

/** The search above a form's client menu, when there are too many clients for one menu. */
export function ClientSearch<T>({ choices, shown }: { choices: ClientChoices<T>; shown: number }) {
  if (!choices.searchable) return null;
  return (
    <TextField
      label="Find a client by name"
      type="search"
      optional
      autoComplete="off"
      value={choices.search}
      onChange={(e) => choices.setSearch(e.target.value)}
      help={choices.value.state === 'ready' && choices.value.data.total > shown ? `${shown} of ${choices.value.data.total} shown: type more of the name to narrow the list.` : undefined}
    />
  );
}
