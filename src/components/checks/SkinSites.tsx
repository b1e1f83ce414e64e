import { SKIN_STATES, type SkinState } from '../../lib/checks/check-input';
import { SKIN_STATE_LABELS } from '../../lib/checks/labels';
import { NAMED_CHANNELS } from '../../lib/rides/types';
import { channelLabel } from '../../lib/format/words';
import { capitalise } from '../../lib/format/words';

/** The skin under each of the six named electrodes, one radio group per site; a site left unchecked is not sent. */
export function SkinSites({ value, onChange }: { value: Record<string, SkinState | ''>; onChange: (v: Record<string, SkinState | ''>) => void }) {
  return (
    <div className="space-y-3">
      <div className="grid gap-3 md:grid-cols-2">
        {NAMED_CHANNELS.map((site) => (
          <fieldset key={site} className="rounded-lg border-2 border-line bg-surface p-3" data-site={site}>
            <legend className="px-1 font-semibold">{channelLabel(site)}</legend>
            <div className="grid gap-1">
              {(['', ...SKIN_STATES] as const).map((state) => (
                <label key={state || 'unchecked'} className="flex min-h-12 cursor-pointer items-center gap-3 rounded px-1">
                  <input
                    type="radio"
                    name={`skin-${site}`}
                    value={state}
                    checked={(value[site] ?? '') === state}
                    onChange={() => onChange({ ...value, [site]: state })}
                    className="h-6 w-6 shrink-0 accent-lagoon"
                  />
                  {state === '' ? 'Not checked' : capitalise(SKIN_STATE_LABELS[state])}
                </label>
              ))}
            </div>
          </fieldset>
        ))}
      </div>
    </div>
  );
}
