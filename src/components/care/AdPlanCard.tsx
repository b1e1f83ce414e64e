import { AD_PLAN_TEXT } from '../../lib/checks/safety-text';

export interface AdPlanData {
  version: number;
  restingSystolic: number | null;
  restingDiastolic: number | null;
  signs: string;
  firstSteps: string;
  physicianPrescribed: string | null;
  whoToCall: string;
  contacts: { name: string; relationship: string | null; phone: string; tel: string }[];
  writtenBy: { name: string | null };
  writtenAt: string;
}

const resting = (p: AdPlanData) =>
  p.restingSystolic === null ? null : `${p.restingSystolic}${p.restingDiastolic !== null ? `/${p.restingDiastolic}` : ''} mmHg`;

/**
 * The rider's own dysreflexia plan as the clinic wrote it. `headingLevel`
 * fits it under the page's headings; contacts are tel: links so a carer can
 * call from the phone that shows it.
 */
export function AdPlanCard({ plan, headingLevel = 3, title = AD_PLAN_TEXT.title, id = 'ad-plan' }: { plan: AdPlanData; headingLevel?: 2 | 3; title?: string; id?: string }) {
  const H = headingLevel === 2 ? 'h2' : 'h3';
  const rest = resting(plan);
  return (
    <section aria-labelledby={`${id}-h`} className="space-y-3 rounded-lg border-2 border-slate/50 bg-surface p-4" data-testid="ad-plan">
      <H id={`${id}-h`} className="text-xl">
        {title}
      </H>
      <dl className="space-y-3">
        {rest && (
          <div>
            <dt className="font-semibold">{AD_PLAN_TEXT.resting}</dt>
            <dd>{rest}</dd>
          </div>
        )}
        <div>
          <dt className="font-semibold">{AD_PLAN_TEXT.signs}</dt>
          <dd className="whitespace-pre-line">{plan.signs}</dd>
        </div>
        <div>
          <dt className="font-semibold">{AD_PLAN_TEXT.firstSteps}</dt>
          <dd className="whitespace-pre-line">{plan.firstSteps}</dd>
        </div>
        {plan.physicianPrescribed && (
          <div>
            <dt className="font-semibold">{AD_PLAN_TEXT.physicianPrescribed}</dt>
            <dd className="whitespace-pre-line">{plan.physicianPrescribed}</dd>
            <dd className="text-sm text-ink-soft">{AD_PLAN_TEXT.physicianNote}</dd>
          </div>
        )}
        <div>
          <dt className="font-semibold">{AD_PLAN_TEXT.whoToCall}</dt>
          <dd className="whitespace-pre-line">{plan.whoToCall}</dd>
        </div>
        {plan.contacts.length > 0 && (
          <div>
            <dt className="font-semibold">{AD_PLAN_TEXT.contacts}</dt>
            <dd>
              <ul className="mt-1 space-y-2">
                {plan.contacts.map((c) => (
                  <li key={c.name + c.phone}>
                    <a href={c.tel} className="inline-flex min-h-12 items-center gap-2 rounded-lg border border-line px-4 font-semibold">
                      Call {c.name}
                      {c.relationship ? ` (${c.relationship})` : ''}: {c.phone}
                    </a>
                  </li>
                ))}
              </ul>
            </dd>
          </div>
        )}
      </dl>
      <p className="text-sm text-ink-soft">
        Version {plan.version}, written by {plan.writtenBy.name ?? 'the clinic'}. {AD_PLAN_TEXT.emergency}
      </p>
    </section>
  );
}
