import { FLAG_KINDS, FLAG_SEVERITIES } from '../../lib/flags/types';
import { SelectField, TextField } from '../ui/Field';
import { FLAG_KIND_WORDS, FLAG_SEVERITY_WORDS } from '../../lib/flags/words';
import type { RowFilter } from './filter';
import type { ListPage } from './types';

/** Search by client name and, when `byFlag`, menus for flag kind and severity with their counts over the whole list. */
export function FlagFilters({
  counts,
  filter,
  onChange,
  byFlag,
}: {
  counts: ListPage['all'];
  filter: RowFilter;
  onChange: (filter: RowFilter) => void;
  byFlag: boolean;
}) {
  return (
    <div role="search" aria-label="Filter clients" className={`grid gap-3 ${byFlag ? 'grid-cols-2 sm:grid-cols-3 [&>*:first-child]:col-span-2 sm:[&>*:first-child]:col-span-1' : 'sm:max-w-sm'}`}>
      <TextField
        label="Search by client name"
        type="search"
        required={false}
        autoComplete="off"
        value={filter.search}
        onChange={(e) => onChange({ ...filter, search: e.target.value })}
      />
      {byFlag && (
        <>
          <SelectField
            label="Severity"
            required={false}
            value={filter.severity}
            onChange={(e) => onChange({ ...filter, severity: e.target.value as RowFilter['severity'] })}
            options={[
              { value: '', label: 'All severities' },
              ...FLAG_SEVERITIES.map((s) => ({ value: s, label: `${FLAG_SEVERITY_WORDS[s]} (${counts.bySeverity[s] ?? 0})` })),
            ]}
          />
          <SelectField
            label="Kind of flag"
            required={false}
            value={filter.kind}
            onChange={(e) => onChange({ ...filter, kind: e.target.value as RowFilter['kind'] })}
            options={[
              { value: '', label: 'All kinds' },
              ...FLAG_KINDS.map((k) => ({ value: k, label: `${FLAG_KIND_WORDS[k]} (${counts.byKind[k] ?? 0})` })),
            ]}
          />
        </>
      )}
    </div>
  );
}
