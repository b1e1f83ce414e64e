// The progress report as a PDF (pdfkit, A4), drawn from the same figures and
// sentences as the report page (report-data.ts, figures.ts, wording.ts).
// Every page carries a header (client, date of birth, clinic, period) and a
// footer (page n of m, when and by whom it was made, and the caution that
// Kinloop is not a diagnostic device).
import PDFDocument from 'pdfkit';
import { channelLimitsText, doseSummary, riding } from '../../components/client/prescription-wording';
import { orderedChannels } from '../../components/rides/channel-order';
import { channelLabel, number } from '../../components/rides/format';
import { PALETTE } from '../../components/palette';
import { GENERAL_CAUTION, NOT_DIAGNOSTIC } from '../checks/safety-text';
import { AD_RISK_LABELS, DIAGNOSIS_LABELS, levelLabel } from '../clients/labels';
import { comparableWeek } from './figures';
import { fontRuns, plexFonts, type Weight } from './pdf-fonts';
import type { Report } from './report-data';
import { plural, reportWords } from './wording';

const PAGE = { width: 595.28, height: 841.89 };
const M = { left: 42, right: 42, top: 74, bottom: 64 };
const CONTENT_W = PAGE.width - M.left - M.right;
const BOTTOM = PAGE.height - M.bottom;
const INK = PALETTE.ink;
const SOFT = PALETTE.inkSoft;
const RULE = PALETTE.lineStrong;
const ACCENT = PALETTE.lagoon;
const SECOND = PALETTE.ochre;

type Doc = PDFKit.PDFDocument;

interface TextOptions {
  size?: number;
  weight?: Weight;
  color?: string;
  width?: number;
  x?: number;
  y?: number;
  gap?: number;
  align?: 'left' | 'right' | 'center';
}

/** Writes text in IBM Plex Sans, switching subsets inside a line where a character needs it. */
function write(doc: Doc, text: string, o: TextOptions = {}) {
  const fonts = plexFonts()[o.weight ?? 'regular'];
  const runs = fontRuns(text, fonts);
  doc.fontSize(o.size ?? 9.5).fillColor(o.color ?? INK);
  const base = { width: o.width ?? CONTENT_W, lineGap: o.gap ?? 1.5, align: o.align ?? 'left' };
  if (!runs.length) return;
  runs.forEach((run, i) => {
    doc.font(fonts[run.font].name);
    const options = { ...base, continued: i < runs.length - 1 };
    if (i === 0 && o.x !== undefined) doc.text(run.text, o.x, o.y ?? doc.y, options);
    else doc.text(run.text, options);
  });
}

function heightOf(doc: Doc, text: string, o: TextOptions = {}): number {
  doc.font(plexFonts()[o.weight ?? 'regular'][0].name).fontSize(o.size ?? 9.5);
  return doc.heightOfString(text || ' ', { width: o.width ?? CONTENT_W, lineGap: o.gap ?? 1.5 });
}

/** Starts a new page when fewer than `height` points are left on this one. */
function room(doc: Doc, height: number) {
  if (doc.y + height > BOTTOM) {
    doc.addPage();
    doc.y = M.top;
  }
}

function heading(doc: Doc, text: string) {
  // A heading never ends a page: keep room for a few lines under it.
  room(doc, 80);
  doc.y += 8;
  write(doc, text, { x: M.left, size: 12.5, weight: 'semibold' });
  const y = doc.y + 1;
  doc.moveTo(M.left, y).lineTo(M.left + CONTENT_W, y).lineWidth(0.6).strokeColor(RULE).stroke();
  doc.y = y + 5;
}

function para(doc: Doc, text: string, o: TextOptions = {}) {
  const h = heightOf(doc, text, o);
  room(doc, Math.min(h, 60));
  write(doc, text, { x: o.x ?? M.left, ...o });
  doc.y += 3;
}

/** A table of rows; the header row repeats on a new page. Column widths are fractions of `width`. */
function table(doc: Doc, columns: { label: string; share: number; align?: 'left' | 'right' }[], rows: string[][], o: { size?: number; x?: number; width?: number } = {}) {
  const size = o.size ?? 8.5;
  const x0 = o.x ?? M.left;
  const width = o.width ?? CONTENT_W;
  const widths = columns.map((c) => c.share * width);
  const pad = 4;
  const drawRow = (cells: string[], weight: Weight) => {
    const h = Math.max(...cells.map((c, i) => heightOf(doc, c, { size, weight, width: widths[i] - pad, gap: 0.5 }))) + 3;
    if (doc.y + h > BOTTOM) {
      doc.addPage();
      doc.y = M.top;
      if (weight === 'regular' && columns.some((c) => c.label)) drawRow(columns.map((c) => c.label), 'semibold');
    }
    const y = doc.y;
    let x = x0;
    cells.forEach((c, i) => {
      write(doc, c, { x, y: y + 1.5, size, weight, width: widths[i] - pad, gap: 0.5, align: columns[i].align ?? 'left' });
      x += widths[i];
    });
    doc.moveTo(x0, y + h).lineTo(x0 + width, y + h).lineWidth(weight === 'semibold' ? 0.8 : 0.3).strokeColor(weight === 'semibold' ? INK : RULE).stroke();
    doc.y = y + h;
  };
  if (columns.some((c) => c.label)) drawRow(columns.map((c) => c.label), 'semibold');
  for (const r of rows) drawRow(r, 'regular');
  doc.x = M.left;
  doc.y += 4;
}

interface ChartSeries {
  kind: 'bars' | 'line';
  values: { x: number; y: number | null }[];
  color: string;
}
interface ChartOptions {
  x: number;
  y: number;
  width: number;
  height: number;
  title: string;
  unit: string;
  digits: number;
  xLabels: [string, string];
  /** Number of x slots for bars (weeks); a line's x is 0…slots−1 as well. */
  slots: number;
  series: ChartSeries[];
  /** Horizontal averages over a range of slots, labelled. */
  averages?: { from: number; to: number; y: number; label: string }[];
}

/** A small vector chart: y from 0, one tick at the top value, bars or a line with dots. */
function chart(doc: Doc, c: ChartOptions) {
  write(doc, c.title, { x: c.x, y: c.y, size: 9, weight: 'semibold', width: c.width });
  const top = c.y + 16;
  const left = c.x + 34;
  const right = c.x + c.width - 4;
  const bottom = top + c.height;
  const all = [...c.series.flatMap((s) => s.values.map((v) => v.y ?? 0)), ...(c.averages ?? []).map((a) => a.y), 0];
  const max = Math.max(...all);
  const yMax = max > 0 ? max * 1.15 : 1;
  const slotW = (right - left) / Math.max(1, c.slots);
  const px = (slot: number) => left + slotW * (slot + 0.5);
  const py = (v: number) => bottom - (v / yMax) * c.height;
  doc.lineWidth(0.6).strokeColor(RULE);
  doc.moveTo(left, bottom).lineTo(right, bottom).stroke();
  doc.moveTo(left, top).lineTo(left, bottom).stroke();
  doc.lineWidth(0.3).dash(1.5, { space: 2 }).moveTo(left, py(max)).lineTo(right, py(max)).stroke().undash();
  write(doc, number(max, c.digits), { x: c.x, y: py(max) - 4, size: 7, color: SOFT, width: 30, align: 'right' });
  write(doc, '0', { x: c.x, y: bottom - 4, size: 7, color: SOFT, width: 30, align: 'right' });
  write(doc, c.xLabels[0], { x: left, y: bottom + 3, size: 7, color: SOFT, width: 90 });
  write(doc, c.xLabels[1], { x: right - 90, y: bottom + 3, size: 7, color: SOFT, width: 90, align: 'right' });
  for (const s of c.series) {
    if (s.kind === 'bars') {
      doc.fillColor(s.color);
      for (const v of s.values) if (v.y) doc.rect(px(v.x) - slotW * 0.32, py(v.y), slotW * 0.64, bottom - py(v.y)).fill();
    } else {
      const points = s.values.filter((v): v is { x: number; y: number } => v.y !== null);
      doc.lineWidth(1.2).strokeColor(s.color);
      points.forEach((p, i) => (i ? doc.lineTo(px(p.x), py(p.y)) : doc.moveTo(px(p.x), py(p.y))));
      if (points.length > 1) doc.stroke();
      doc.fillColor(s.color);
      for (const p of points) doc.circle(px(p.x), py(p.y), 1.8).fill();
    }
  }
  for (const a of c.averages ?? []) {
    const x1 = px(a.from) - slotW / 2;
    const x2 = px(a.to) + slotW / 2;
    doc.lineWidth(1.2).strokeColor(SECOND).dash(3, { space: 2 }).moveTo(x1, py(a.y)).lineTo(x2, py(a.y)).stroke().undash();
  }
  if (c.averages?.length) {
    const y = bottom + 13;
    doc.lineWidth(1.2).strokeColor(SECOND).dash(3, { space: 2 }).moveTo(left, y + 4).lineTo(left + 16, y + 4).stroke().undash();
    write(doc, c.averages.map((a) => a.label).join(' · '), { x: left + 20, y, size: 7, color: SECOND, width: right - left - 20 });
    return y + 14;
  }
  return bottom + 14;
}

export async function reportPdf(report: Report, locale: string): Promise<Buffer> {
  const w = reportWords(report, locale);
  const f = report.figures;
  const c = report.client;
  const doc = new PDFDocument({
    size: 'A4',
    margins: M,
    bufferPages: true,
    lang: locale,
    displayTitle: true,
    info: { Title: `Progress report: ${c.name}`, Author: report.producedBy, Subject: `${report.clinic.name}, ${w.period}`, Creator: 'Kinloop', CreationDate: new Date(report.producedAt) },
  });
  for (const weight of ['regular', 'semibold'] as const) for (const font of plexFonts()[weight]) doc.registerFont(font.name, font.data);
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  doc.y = M.top;
  write(doc, `Progress report: ${c.name}`, { x: M.left, size: 17, weight: 'semibold' });
  doc.y += 4;
  const about: [string, string][] = [
    ['Diagnosis', DIAGNOSIS_LABELS[c.diagnosis]],
    ...(c.diagnosis === 'sci' || levelLabel(c.injuryLevel, c.aisGrade) ? [['Level', levelLabel(c.injuryLevel, c.aisGrade) ?? 'Not recorded'] as [string, string]] : []),
    ['Autonomic dysreflexia', AD_RISK_LABELS[c.adRisk]],
    ['Program start', w.day(report.programStart)],
    ['Report period', w.period],
    ['Produced', w.produced],
  ];
  const colW = CONTENT_W / 3;
  for (let i = 0; i < about.length; i += 3) {
    const y = doc.y;
    let bottom = y;
    about.slice(i, i + 3).forEach(([label, value], j) => {
      write(doc, label, { x: M.left + j * colW, y, size: 7.5, color: SOFT, width: colW - 8 });
      write(doc, value, { size: 9, weight: 'semibold', width: colW - 8 });
      bottom = Math.max(bottom, doc.y);
    });
    doc.y = bottom + 4;
  }
  para(doc, w.zoneNote, { size: 7.5, color: SOFT });

  if (report.summary) {
    heading(doc, 'Therapist summary');
    para(doc, report.summary);
  }

  heading(doc, 'Prescription');
  const rx = report.prescription.current;
  if (rx) {
    para(doc, `Version ${rx.version}, in effect since ${w.day(rx.effectiveFrom)}: ${doseSummary(rx)}${riding(rx) ? `; ${riding(rx)}` : ''}.`);
    const channels = orderedChannels(Object.keys(rx.channels));
    if (channels.length) para(doc, `Stimulation limits: ${channels.map((n) => `${channelLabel(n)} ${channelLimitsText(rx.channels[n])}`).join('; ')}.`, { size: 8.5 });
    if (rx.notes) para(doc, `Notes: ${rx.notes}`, { size: 8.5 });
  } else {
    para(doc, 'No prescription is in effect.');
  }
  para(doc, `Changes in this period: ${w.prescriptionChanges.length ? '' : w.noChanges}`, { weight: 'semibold', size: 9 });
  for (const line of w.prescriptionChanges) para(doc, `• ${line}`, { size: 8.5, x: M.left + 8, width: CONTENT_W - 8 });

  heading(doc, 'Sessions in this period');
  if (f.sessions.count) {
    const rows = [...w.sessionRows, ...(w.blocks ? w.blocks.rows.map(([l, v]) => [`${l}, first and last ${plural(f.blocks!.weeks, 'week')}`, v] as [string, string]) : [])];
    table(doc, [{ label: '', share: 0.36 }, { label: '', share: 0.64 }], rows);
    if (w.energy) {
      table(doc, [{ label: '', share: 0.36 }, { label: '', share: 0.64 }], [
        ['Estimated energy (FES)', `${w.energy.estimate}. ${w.energy.method}`],
        ...(w.energy.acsm ? [['Volitional-cycling equation (ACSM)', `${w.energy.acsm.value}. ${w.energy.acsm.method}`]] : []),
      ]);
    }
    para(doc, w.sinceStart, { size: 7.5, color: SOFT });

    // Weekly charts side by side, then current per watt per session.
    room(doc, 120);
    const slots = f.weeks.length;
    const firstLabel = w.weekFrom(f.weeks[0].monday);
    const lastLabel = w.weekFrom(f.weeks[slots - 1].monday);
    const blockRange = (first: boolean) => {
      const comparable = f.weeks.map((wk, i) => ({ wk, i })).filter(({ wk }) => comparableWeek(wk));
      const part = first ? comparable.slice(0, f.blocks?.weeks ?? 0) : comparable.slice(-(f.blocks?.weeks ?? 0));
      return { from: part[0]?.i ?? 0, to: part[part.length - 1]?.i ?? 0 };
    };
    const half = (CONTENT_W - 16) / 2;
    const y0 = doc.y + 2;
    const averages = (pick: (b: NonNullable<typeof f.blocks>['first']) => number | null, unit: string, digits: number) =>
      f.blocks
        ? ([true, false] as const).flatMap((first) => {
            const b = first ? f.blocks!.first : f.blocks!.last;
            const y = pick(b);
            return y === null ? [] : [{ ...blockRange(first), y, label: `${first ? 'First' : 'last'} ${plural(f.blocks!.weeks, 'week')}: ${number(y, digits)} ${unit}` }];
          })
        : [];
    const bottoms = [chart(doc, {
      x: M.left,
      y: y0,
      width: half,
      height: 70,
      title: 'Active minutes per week',
      unit: 'min',
      digits: 0,
      slots,
      xLabels: [firstLabel, lastLabel],
      series: [{ kind: 'bars', color: ACCENT, values: f.weeks.map((wk, i) => ({ x: i, y: wk.activeMin })) }],
      averages: averages((b) => b.activeMinPerWeek, 'min', 0),
    }),
    chart(doc, {
      x: M.left + half + 16,
      y: y0,
      width: half,
      height: 70,
      title: 'Mean power per week (W)',
      unit: 'W',
      digits: 1,
      slots,
      xLabels: [firstLabel, lastLabel],
      series: [{ kind: 'line', color: ACCENT, values: f.weeks.map((wk, i) => ({ x: i, y: wk.meanPowerW })) }],
      averages: averages((b) => b.meanPowerW, 'W', 1),
    })];
    doc.y = Math.max(...bottoms);
    if (f.series.currentPerWatt.length >= 2) {
      room(doc, 110);
      const span = Math.max(1, f.period.endMs - f.period.startMs);
      const slotsCpw = 100;
      doc.y = chart(doc, {
        x: M.left,
        y: doc.y + 2,
        width: half,
        height: 60,
        title: 'Current per watt per session (mA/W)',
        unit: 'mA/W',
        digits: 2,
        slots: slotsCpw,
        xLabels: [w.day(report.period.from), w.day(report.period.to)],
        series: [{ kind: 'line', color: ACCENT, values: f.series.currentPerWatt.map((p) => ({ x: Math.min(slotsCpw - 1, Math.floor(((p.t - f.period.startMs) / span) * slotsCpw)), y: p.y })) }],
      });
    }
    para(doc, 'Bars and dots: each week of the period (the last may be under way). Dashed lines: the averages of the first and last finished weeks compared above.', { size: 7.5, color: SOFT });
  } else {
    para(doc, 'No sessions in this period.');
  }

  heading(doc, 'Adherence by week');
  para(doc, w.adherenceSummary);
  const estimate = f.energy.totalKcal !== null;
  table(
    doc,
    [
      { label: 'Week from', share: 0.17 },
      { label: 'Prescribed', share: 0.1, align: 'right' },
      { label: 'Counted', share: 0.1, align: 'right' },
      { label: 'Short', share: 0.08, align: 'right' },
      { label: 'Active min', share: 0.11, align: 'right' },
      { label: 'Mean power (W)', share: 0.13, align: 'right' },
      ...(estimate ? [{ label: 'Est. kcal', share: 0.1, align: 'right' as const }] : []),
      { label: 'Outcome', share: estimate ? 0.21 : 0.31 },
    ],
    f.weeks.map((wk) => [
      w.weekFrom(wk.monday),
      String(wk.prescribed),
      String(wk.counted),
      String(wk.short),
      number(wk.activeMin, 0),
      number(wk.meanPowerW, 1),
      ...(estimate ? [number(wk.energyKcal, 0)] : []),
      wk.outcome,
    ]),
    { size: 7.5 },
  );
  para(doc, w.countRule, { size: 7.5, color: SOFT });
  if (w.pauses) para(doc, w.pauses, { size: 8.5 });

  heading(doc, 'Flags and what was done');
  if (f.flags.length) {
    for (const flag of f.flags) {
      room(doc, 40);
      para(doc, w.flagTitle(flag), { weight: 'semibold', size: 9 });
      para(doc, `${w.flagReason(flag)} ${w.flagRaised(flag)}`, { size: 8.5 });
      for (const h of flag.history) para(doc, w.flagEvent(h), { size: 7.5, x: M.left + 10, width: CONTENT_W - 10, color: SOFT });
    }
  } else {
    para(doc, 'No flags were raised or open in this period.');
  }

  heading(doc, 'Checks and blood pressure events');
  if (f.checks.list.length) {
    para(doc, w.checksSummary, { size: 8.5 });
    for (const x of f.checks.findings) para(doc, `• ${w.finding(x)}`, { size: 8.5, x: M.left + 8, width: CONTENT_W - 8 });
  } else {
    para(doc, 'No checks were recorded in this period.');
  }

  heading(doc, 'Therapist notes');
  if (f.notes.length) {
    for (const n of f.notes) {
      para(doc, w.noteBy(n), { size: 7.5, color: SOFT });
      para(doc, n.body, { size: 8.5 });
    }
  } else {
    para(doc, 'No notes were written in this period.');
  }

  heading(doc, 'Safety');
  para(doc, GENERAL_CAUTION, { size: 8.5 });

  // Header and footer on every page, once the page count is known.
  const range = doc.bufferedPageRange();
  const born = c.dateOfBirth ? `born ${w.date(c.dateOfBirth)}` : 'date of birth not recorded';
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    // Writing below the bottom margin would make pdfkit start a page of its own.
    doc.page.margins.bottom = 0;
    write(doc, `${c.name} · ${born}`, { x: M.left, y: 28, size: 9, weight: 'semibold', width: CONTENT_W * 0.6 });
    write(doc, report.clinic.name, { x: M.left + CONTENT_W * 0.6, y: 28, size: 9, width: CONTENT_W * 0.4, align: 'right' });
    write(doc, `Progress report, ${w.period}`, { x: M.left, y: 41, size: 8, color: SOFT, width: CONTENT_W });
    doc.moveTo(M.left, 56).lineTo(M.left + CONTENT_W, 56).lineWidth(0.6).strokeColor(RULE).stroke();
    const fy = PAGE.height - M.bottom + 12;
    doc.moveTo(M.left, fy - 4).lineTo(M.left + CONTENT_W, fy - 4).lineWidth(0.6).strokeColor(RULE).stroke();
    write(doc, `Generated ${w.produced}`, { x: M.left, y: fy, size: 7.5, color: SOFT, width: CONTENT_W * 0.75 });
    write(doc, `Page ${i - range.start + 1} of ${range.count}`, { x: M.left + CONTENT_W * 0.75, y: fy, size: 7.5, weight: 'semibold', width: CONTENT_W * 0.25, align: 'right' });
    write(doc, NOT_DIAGNOSTIC, { x: M.left, y: fy + 11, size: 7, color: SOFT, width: CONTENT_W });
  }
  doc.end();
  return done;
}
