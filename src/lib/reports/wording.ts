// The sentences of a progress report, shared by the page and the PDF so that
// both say the same thing in the same words.
import { eventLabel, STATE_LABELS } from '../../components/client/flag-labels';
import { versionChanges } from '../../components/client/prescription-wording';
import { distance, number, signed, withUnit } from '../format/numbers';
import { flagReason } from '../flags/reason';
import { FLAG_KIND_WORDS, FLAG_SEVERITY_WORDS } from '../flags/words';
import { formatDate, formatDateTime } from '../time/format';
import { localDate } from '../time/local-date';
import type { Report } from './report-data';

export const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
export const sentence = (text: string) => (text.endsWith('.') ? text : `${text}.`);
export const pct = (v: number | null) => (v === null ? '—' : `${v} %`);

export { signed };

export function reportWords(report: Report, locale: string) {
  const tz = report.client.timeZone;
  const f = report.figures;
  const day = (localDay: string) => formatDate(localDay, locale, 'day');
  const at = (instant: string) => formatDateTime(instant, locale, tz, 'dateShort');
  // Every week starts on a Monday, so the weekday is left out.
  const weekFrom = (monday: string) => formatDate(monday, locale, 'dateShort');
  /** A calendar date without its weekday, as for a date of birth. */
  const date = weekFrom;
  const history = report.prescription.history;

  return {
    day,
    at,
    date,
    weekFrom,
    period: `${day(report.period.from)} to ${day(report.period.to)} (${report.period.weeks ? `${report.period.weeks} weeks` : plural(report.period.days, 'day')})`,
    produced: `${at(report.producedAt)} by ${report.producedBy}`,
    zoneNote: `Dates and times are in the client's time zone (${tz.replaceAll('_', ' ')}). A week runs Monday to Sunday.`,
    prescriptionChanges: f.prescription.changes.map((v) => {
      const previous = history[history.indexOf(v) + 1];
      return `Version ${v.version} from ${day(v.effectiveFrom)}${v.createdBy.name ? `, saved by ${v.createdBy.name}` : ''}: ${sentence(versionChanges(previous, v).join('; '))}`;
    }),
    noChanges: `None${f.prescription.atStart ? `: version ${f.prescription.atStart.version} held throughout` : ''}.`,
    adherenceSummary: `4-week adherence ${pct(report.adherence.adherence4wPct)} · streak ${plural(report.adherence.streakWeeks, 'week')} · ${f.adherence.met} of ${plural(f.adherence.judged, 'finished week')} with a prescription met.`,
    countRule: `A session counts when it lasts at least ${report.countThresholdPct} % of the prescribed minutes; shorter ones are listed as short. A paused week is neither met nor missed.`,
    pauses: f.pauses.length ? `Pauses: ${f.pauses.map((p) => `${day(p.from)} to ${day(p.to)} (${p.reason})`).join('; ')}.` : null,
    /** Label and value rows of the session figures. */
    sessionRows: sessionRows(report, locale, day),
    blocks: f.blocks
      ? {
          caption: `Average of the first and last ${plural(f.blocks.weeks, 'finished week')} with sessions prescribed`,
          rows: [
            ['Active minutes a week', `${number(f.blocks.first.activeMinPerWeek, 0, locale)} → ${number(f.blocks.last.activeMinPerWeek, 0, locale)} min (${signed(f.blocks.activeMinChange, 0, locale)} min)`],
            [
              'Mean power',
              `${withUnit(f.blocks.first.meanPowerW, 1, 'W', locale)} → ${withUnit(f.blocks.last.meanPowerW, 1, 'W', locale)}${
                f.blocks.powerChangeW === null ? '' : ` (${signed(f.blocks.powerChangeW, 1, locale)} W${f.blocks.powerChangePct === null ? '' : `, ${signed(f.blocks.powerChangePct, 0, locale)} %`})`
              }`,
            ],
          ] as [string, string][],
        }
      : null,
    energy: energyWords(report, locale),
    sinceStart: `Since the program started: ${plural(report.totals.sessions, 'session')}, ${number(report.totals.activeMinutes, 0, locale)} active minutes, ${distance(report.totals.distanceM, locale)}. Mean power over several sessions is weighted by their active time. A rising current per watt means more stimulation for the same power.`,
    flagReason: (flag: Report['figures']['flags'][number]) => flagReason(flag, locale),
    flagTitle: (flag: Report['figures']['flags'][number]) => `${FLAG_KIND_WORDS[flag.kind]} · ${FLAG_SEVERITY_WORDS[flag.severity]} · ${STATE_LABELS[flag.state]}`,
    flagRaised: (flag: Report['figures']['flags'][number]) =>
      `Raised ${at(flag.raisedAt)}${flag.clearedAt ? `; the condition cleared ${at(flag.clearedAt)}` : ''}${
        flag.snoozedUntil && (flag.state === 'open' || flag.state === 'acknowledged') && flag.snoozedUntil > report.today ? `; snoozed until ${day(flag.snoozedUntil)}` : ''
      }.`,
    flagEvent: (h: Report['figures']['flags'][number]['history'][number]) =>
      `${at(h.at)}: ${eventLabel(h.action)}${h.action === 'snoozed' && typeof h.detail?.until === 'string' ? ` until ${day(h.detail.until)}` : ''} (${h.by?.name ?? 'Kinloop'})${h.note ? `: “${h.note}”` : ''}`,
    checksSummary: `${plural(f.checks.list.length, 'check')} recorded, ${f.checks.withBp} with blood pressure readings. Blood pressure rise: ${f.checks.bpRise}. Blood pressure fall after riding: ${f.checks.bpDrop}. Skin concern: ${f.checks.skin}. Checks with symptoms of possible autonomic dysreflexia: ${f.checks.withSymptoms}.`,
    finding: (x: Report['figures']['checks']['findings'][number]) => `${at(x.takenAt)}, ${FLAG_KIND_WORDS[x.kind]}: ${x.reason}${x.by ? ` (recorded by ${x.by})` : ''}`,
    noteBy: (n: Report['figures']['notes'][number]) => `${at(n.createdAt)}, ${n.author.name}`,
  };
}

function sessionRows(report: Report, locale: string, day: (d: string) => string): [string, string][] {
  const s = report.figures.sessions;
  if (!s.count) return [];
  const rows: [string, string][] = [
    ['Sessions', `${s.count} (${s.counted} counted towards the prescription)`],
    ['Active time', `${number(s.activeS / 60, 0, locale)} min in all, ${number(s.meanActiveS! / 60, 0, locale)} min a session on average`],
  ];
  if (s.half > 0) rows.push([`Mean power, first and last ${plural(s.half, 'session')}`, `${withUnit(s.firstPower, 1, 'W', locale)} → ${withUnit(s.lastPower, 1, 'W', locale)}`]);
  rows.push(['Mean power trend, last 8 weeks', report.powerTrendWPerWeek === null ? 'Too few sessions to tell' : `${signed(report.powerTrendWPerWeek, 2, locale)} W a week`]);
  rows.push(['Highest 5-second power', s.peak ? `${withUnit(s.peak.peakPower5sW, 1, 'W', locale)} on ${day(localDate(s.peak.startedAt, report.client.timeZone))}` : '—']);
  rows.push(['Distance', distance(s.distanceM, locale)]);
  if (s.cpwHalf > 0) rows.push([`Current per watt, first and last ${plural(s.cpwHalf, 'session')}`, `${withUnit(s.firstCpw, 2, 'mA/W', locale)} → ${withUnit(s.lastCpw, 2, 'mA/W', locale)}`]);
  rows.push(['Current per watt trend, this period', s.cpwPerWeek === null ? 'Too few sessions to tell' : `${signed(s.cpwPerWeek, 2, locale)} mA/W a week`]);
  return rows;
}

function energyWords(report: Report, locale: string) {
  const e = report.figures.energy;
  if (e.totalKcal === null) return null;
  const efficiency = `${number(e.efficiencyPct, e.efficiencyPct % 1 ? 1 : 0, locale)} %`;
  return {
    estimate: `${number(e.totalKcal, 0, locale)} kcal in this period, ${number(e.perSessionKcal, 0, locale)} kcal a session on average (${plural(e.sessionsWithEstimate, 'session')} with a power figure)`,
    method: `Estimate, not a measurement: the crank work (watts × seconds) divided by an assumed FES-cycling efficiency of ${efficiency} and by 4184 joules per kcal. The efficiency is a clinic setting; studies report 2–14 % for FES cycling, far below volitional cycling.`,
    acsm: e.acsm
      ? {
          value: `${number(e.acsm.vo2MlKgMin, 2, locale)} mL/kg/min, ${number(e.acsm.kcalPerMin, 2, locale)} kcal/min at the period's mean power of ${number(e.acsm.atPowerW, 1, locale)} W and ${number(e.acsm.bodyMassKg, 1, locale)} kg${e.acsm.totalKcal === null ? '' : `; ${number(e.acsm.totalKcal, 0, locale)} kcal over the period's active time`}`,
          method: 'For comparison only: the ACSM leg-cycling equation is made for volitional cycling (pedalling by one’s own effort), not for FES cycling; it adds resting and unloaded-pedalling oxygen use and assumes a volitional cyclist’s efficiency.',
        }
      : null,
  };
}
