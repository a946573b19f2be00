/**
 * The Savings report as a PDF, drawn with pdfkit from the stored snapshot: cover, findings,
 * reconciliation, the plan, payback, cautions and method notes. Figures are right-aligned in a
 * monospaced face with their units. The PDF uses the standard PDF faces (Helvetica, Courier):
 * pdfkit's font subsetter fails on the IBM Plex web-font files we ship (see DEVELOPERS.md).
 */
import PDFDocument from 'pdfkit';
import type { ReportSnapshot } from './snapshot';


const INK = '#1d2430';
const MUTED = '#5b6270';
const RULE = '#d9d4c7';
const COST = '#b23a2a';
const SAVING = '#4f7a28';
const LAG = '#6b3fa0';

/** The standard PDF faces carry the Western (WinAnsi) set: spell out the few symbols outside it. */
const pdfText = (s: string) => s.replace(/→/g, '->').replace(/≥/g, '>=').replace(/≤/g, '<=').replace(/Δ/g, 'd').replace(/φ/g, 'phi').replace(/√/g, 'sqrt').replace(/−/g, '-').replace(/≈/g, '~').replace(/×/g, 'x').replace(/²/g, '^2').replace(/[“”]/g, '"').replace(/[‘’]/g, "'");

export function renderReportPdf(s: ReportSnapshot): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A4', margins: { top: 56, bottom: 56, left: 56, right: 56 }, info: { Title: pdfText(s.title), Author: s.issuedBy.name, Creator: 'Varledger' } });
  doc.registerFont('sans', 'Helvetica');
  doc.registerFont('sans-medium', 'Helvetica-Bold');
  doc.registerFont('sans-bold', 'Helvetica-Bold');
  doc.registerFont('mono', 'Courier');
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));

  const cur = s.currency;
  const money = (x: number | null | undefined, d = 0) => (x === null || x === undefined || !Number.isFinite(x) ? '-' : x.toLocaleString('en-US', { style: 'currency', currency: cur, minimumFractionDigits: d, maximumFractionDigits: d }));
  const num = (x: number | null | undefined, d = 0) => (x === null || x === undefined || !Number.isFinite(x) ? '-' : x.toLocaleString('en-US', { minimumFractionDigits: d, maximumFractionDigits: d }));
  const W = doc.page.width - 112;
  const left = 56;

  const h1 = (t: string) => doc.font('sans-bold').fontSize(20).fillColor(INK).text(pdfText(t), { width: W });
  const h2 = (t: string) => {
    if (doc.y > doc.page.height - 160) doc.addPage();
    doc.moveDown(0.8).font('sans-bold').fontSize(13).fillColor(INK).text(pdfText(t));
    doc.moveTo(left, doc.y + 2).lineTo(left + W, doc.y + 2).strokeColor(INK).lineWidth(0.8).stroke();
    doc.moveDown(0.5);
  };
  const p = (t: string, opts: { color?: string; size?: number } = {}) => doc.font('sans').fontSize(opts.size ?? 10).fillColor(opts.color ?? INK).text(pdfText(t), { width: W });

  /** A ruled table: first column left-aligned text, the others right-aligned mono figures. */
  const table = (head: string[], rows: (string | { t: string; color?: string })[][], widths: number[]) => {
    const x0 = left;
    const rowH = 15;
    const draw = (cells: (string | { t: string; color?: string })[], header: boolean) => {
      if (doc.y > doc.page.height - 80) doc.addPage();
      const y = doc.y;
      let x = x0;
      cells.forEach((c, i) => {
        const cell = typeof c === 'string' ? { t: c } : c;
        doc.font(header ? 'sans-medium' : i === 0 ? 'sans' : 'mono').fontSize(header ? 8 : 8.5).fillColor(header ? MUTED : (cell.color ?? INK));
        doc.text(pdfText(cell.t), x + 2, y + 3, { width: widths[i]! - 4, align: i === 0 ? 'left' : 'right', lineBreak: false, ellipsis: true });
        x += widths[i]!;
      });
      doc.moveTo(x0, y + rowH).lineTo(x0 + widths.reduce((a, b) => a + b, 0), y + rowH).strokeColor(header ? INK : RULE).lineWidth(header ? 0.8 : 0.5).stroke();
      doc.x = x0;
      doc.y = y + rowH;
    };
    draw(head, true);
    rows.forEach((r) => draw(r, false));
    doc.moveDown(0.6);
    doc.x = left;
  };

  /** Bars per month (two series side by side when `after` is given), with a value axis label. */
  const bars = (labels: string[], before: number[], after: number[] | null, caption: string) => {
    if (doc.y > doc.page.height - 200) doc.addPage();
    const h = 110;
    const y0 = doc.y + h;
    const max = Math.max(1, ...before, ...(after ?? []));
    const slot = W / labels.length;
    labels.forEach((l, i) => {
      const bw = after ? slot * 0.35 : slot * 0.6;
      const x = left + i * slot + (after ? slot * 0.12 : slot * 0.2);
      const hb = (before[i]! / max) * h;
      doc.rect(x, y0 - hb, bw, hb).fill(COST);
      if (after) {
        const ha = (after[i]! / max) * h;
        doc.rect(x + bw + 2, y0 - ha, bw, ha).fill(SAVING);
      }
      doc.font('sans').fontSize(7).fillColor(MUTED).text(l, left + i * slot, y0 + 3, { width: slot, align: 'center' });
    });
    doc.moveTo(left, y0).lineTo(left + W, y0).strokeColor(INK).lineWidth(0.6).stroke();
    doc.font('sans').fontSize(7.5).fillColor(MUTED).text(pdfText(`${caption} Highest bar: ${money(max)}.`), left, y0 + 14, { width: W });
    doc.moveDown(0.6);
  };

  const ev = s.plan.evaluation;
  const e = ev.economics;

  // Cover
  doc.font('sans-bold').fontSize(11).fillColor(INK).text('Varledger');
  doc.moveDown(3);
  h1(s.title);
  doc.moveDown(0.3);
  p(`${s.site.name}${s.site.address ? `, ${s.site.address}` : ''}`, { size: 12 });
  p(`Prepared for ${s.workspaceName} by ${s.issuedBy.name}, ${new Date(s.issuedAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric' })}`, { color: MUTED });
  doc.moveDown(2);
  const keys: [string, string, string][] = [
    ['PF-related charges, last 12 months', money(s.findings.totalPfCharge), COST],
    [`Recommended: ${ev.plan.kind === 'fixed' ? 'Fixed bank' : `Switched bank (${ev.plan.stepsKvar?.length ?? 0} steps)`}`, `${num(ev.plan.kvar)} kvar`, INK],
    ['Annual saving', money(e.annualSaving), SAVING],
    ['Simple payback', e.paybackYears === null ? 'not paid back' : `${num(e.paybackYears, 1)} years`, INK],
    [`NPV over ${e.lifeYears} years at ${num(e.discountRate * 100, 1)} %`, money(e.npv), e.npv >= 0 ? SAVING : COST],
    ['Disputable on past bills', money(s.reconciliation.disputable), s.reconciliation.disputable > 0 ? COST : INK],
  ];
  for (const [label, value, color] of keys) {
    const y = doc.y;
    doc.font('sans').fontSize(10).fillColor(MUTED).text(pdfText(label), left, y, { width: W * 0.6 });
    doc.font('mono').fontSize(14).fillColor(color).text(value, left + W * 0.6, y - 2, { width: W * 0.4, align: 'right' });
    doc.moveTo(left, doc.y + 4).lineTo(left + W, doc.y + 4).strokeColor(RULE).lineWidth(0.5).stroke();
    doc.moveDown(0.8);
    doc.x = left;
  }
  doc.moveDown(1);
  p('Capacitor banks must be designed and installed by qualified persons under local electrical codes and the utility\'s rules. The figures are estimates from interval averages and the tariff as entered: see the cautions and method notes at the end.', { color: MUTED, size: 9 });

  // Findings
  doc.addPage();
  h2('What power factor cost over the last twelve months');
  p(`Tariff: ${s.findings.tariffName ?? 'not entered'}. Monthly figures from the site's interval data in ${s.site.timeZone} time.`, { color: MUTED, size: 9 });
  doc.moveDown(0.4);
  table(
    ['Month', 'Energy kWh', 'Lagging kvarh', 'Average PF', 'Peak kW', 'PF at peak', `PF charge ${cur}`],
    s.findings.months.map((m) => [m.label, num(m.kwh), num(m.kvarhLag), m.pfAvg?.toFixed(3) ?? '-', num(m.peakKw, 1), m.peakPf?.toFixed(3) ?? '-', { t: money(m.pfCharge, 2), color: COST }]),
    [110, 70, 70, 55, 55, 55, W - 415],
  );
  bars(s.findings.months.map((m) => m.label.slice(0, 3)), s.findings.months.map((m) => m.pfCharge ?? 0), null, 'PF charge by month (red).');
  const example = s.findings.months.find((m) => m.rules.length > 0);
  if (example) {
    p(`How ${example.label} was charged:`, { size: 9 });
    for (const r of example.rules) p(`${r.label}: ${r.explanation}`, { color: MUTED, size: 8.5 });
  }
  for (const n of s.findings.notes) p(n, { color: MUTED, size: 8.5 });

  // Reconciliation
  h2('Bills against the meter data');
  p(`${s.reconciliation.bills} bills entered, ${s.reconciliation.compared} compared with the interval data, ${s.reconciliation.flagged} with a difference. Disputable PF charges: ${money(s.reconciliation.disputable, 2)}.`, { size: 9.5 });
  if (s.reconciliation.multiplier) p(s.reconciliation.multiplier, { color: COST, size: 9.5 });
  if (s.reconciliation.rows.length) {
    doc.moveDown(0.3);
    table(['Billing period', `Billed PF charge ${cur}`, `Recomputed ${cur}`, 'Difference'], s.reconciliation.rows.map((r) => [r.period, money(r.billedCharge, 2), money(r.computedCharge, 2), r.flagged ? { t: money((r.billedCharge ?? 0) - (r.computedCharge ?? 0), 2), color: COST } : r.computedCharge === null ? (r.note ? 'not compared' : '-') : 'within tolerance']), [160, 110, 110, W - 380]);
  }

  // The plan
  h2(`The plan: ${s.plan.name}`);
  p(`${ev.plan.kind === 'fixed' ? 'Fixed bank' : 'Switched bank'} of ${num(ev.plan.kvar)} kvar${ev.plan.stepsKvar ? ` in ${ev.plan.stepsKvar.length} steps (${ev.plan.stepsKvar.map((k) => num(k)).join(' + ')} kvar)` : ''}${ev.plan.detunedReactorPct ? `, detuned with ${ev.plan.detunedReactorPct} % reactors` : ''}; ${num(ev.plan.effectiveKvar)} kvar delivered at the service voltage. Average PF ${ev.pf.before?.toFixed(3) ?? '-'} before, ${ev.pf.after?.toFixed(3) ?? '-'} after.`, { size: 9.5 });
  doc.moveDown(0.3);
  table(['Month', `Before ${cur}`, `After ${cur}`, `Saving ${cur}`, 'Leading h'], ev.months.map((m) => [m.label, money(m.before, 2), money(m.after, 2), { t: money(m.saving, 2), color: SAVING }, num(m.leadingHours, 1)]), [130, 90, 90, 90, W - 400]);
  bars(ev.months.map((m) => m.label.slice(0, 3)), ev.months.map((m) => m.before), ev.months.map((m) => m.after), 'PF charge by month as metered (red) and with the plan (green).');
  if (ev.leading.message) p(ev.leading.message, { color: ev.leading.goesLeading ? COST : MUTED, size: 9 });
  const sc = ev.screening;
  if (sc.resonance) p(`Resonance screening: ${sc.resonance.message}`, { size: 9 });
  if (sc.detuned) p(sc.detuned.message, { size: 9 });
  if (sc.voltageRise) p(`Voltage rise: ${sc.voltageRise.message}`, { size: 9 });
  for (const m of sc.missing) p(m, { color: MUTED, size: 9 });

  // Payback
  h2('Payback');
  table(['Item', `Amount ${cur}`], [...e.capexLines.map((l) => [l.label, money(l.amount)]), ['Capex', money(e.capex)], ['Annual saving (tariff charges avoided)', { t: money(e.annualSaving), color: SAVING }], ['Operation and maintenance per year', money(e.omPerYear)], ['Simple payback', e.paybackYears === null ? 'not paid back' : `${num(e.paybackYears, 1)} years`], [`NPV (${e.lifeYears} years, ${num(e.discountRate * 100, 1)} %)`, money(e.npv)], ['IRR', e.irr === null ? '-' : `${num(e.irr * 100, 1)} %`]], [W - 140, 140]);
  table(['Savings at', 'Payback years', `NPV ${cur}`, 'IRR'], e.sensitivity.map((x) => [`${Math.round(x.savingsFactor * 100)} %`, x.paybackYears === null ? 'not paid back' : num(x.paybackYears, 1), money(x.npv), x.irr === null ? '-' : `${num(x.irr * 100, 1)} %`]), [W - 300, 100, 100, 100]);
  if (e.optional.length) p(`Optional benefits, ${e.optionalCounted ? 'counted' : 'shown but not counted'}: ${e.optional.map((o) => `${o.label} ${money(o.perYear)}/yr`).join('; ')}.`, { color: MUTED, size: 9 });

  // Cautions and method
  h2('Cautions');
  for (const c of s.cautions) {
    doc.font('sans-medium').fontSize(9.5).fillColor(INK).text(pdfText(c.title), { width: W });
    p(c.text, { size: 9, color: MUTED });
    doc.moveDown(0.3);
  }
  h2('Method notes');
  for (const n of s.methodNotes) {
    doc.font('sans-medium').fontSize(9.5).fillColor(INK).text(pdfText(n.title), { width: W });
    p(n.formula, { size: 9 });
    p(`Source: ${n.source}`, { size: 8.5, color: MUTED });
    doc.moveDown(0.3);
  }
  doc.end();
  return done;
}
