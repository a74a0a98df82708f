/**
 * The readable diagnosis of an analysed trace: the JSON export (`report.json`) and the e-mail
 * that "Share diagnosis" sends (plain text and HTML with the same content). Findings carry their
 * rule id, the rule's title and the one plain sentence of the finding.
 */
import type { Analysis } from '../../../shared/trace/index.ts';
import { ruleTitle } from '../../../shared/rules/index.ts';
import type { OutgoingMail } from '../../mail/mailer.ts';
import type { PresentedTrace } from './present.ts';

/** Findings listed in a mail; the rest are counted (the trace page has them all). */
const MAIL_FINDINGS = 40;

const seconds = (us: number | undefined) => (us === undefined ? '' : `${(us / 1_000_000).toFixed(3).replace(/\.?0+$/, '')} s`);
const volts = (mv: number) => `${(mv / 1_000).toFixed(2).replace(/\.?0+$/, '')} V`;
const amps = (ma: number) => `${(ma / 1_000).toFixed(2).replace(/\.?0+$/, '')} A`;

function contractLine(c: Analysis['contracts'][number]): string {
  return `${c.kind === 'fixed' ? '' : `${c.kind.toUpperCase()} `}${volts(c.voltageMv)} ${amps(c.currentMa)} (object ${c.objectPosition}) from ${seconds(c.t)}`;
}

export function buildReport(trace: PresentedTrace, analysis: Omit<Analysis, 'timeline'>, link: string) {
  return {
    report: 1,
    trace: {
      id: trace.id,
      title: trace.title,
      fileName: trace.fileName,
      format: trace.format,
      sizeBytes: trace.sizeBytes,
      sha256: trace.sha256,
      device: trace.device?.name ?? null,
      customerRef: trace.customerRef,
      notes: trace.notes,
      uploadedBy: trace.uploader.name,
      createdAt: trace.createdAt,
      link,
    },
    summary: analysis.summary,
    messages: analysis.messages,
    counts: analysis.counts,
    contracts: analysis.contracts,
    hardResets: analysis.hardResets,
    findings: analysis.findings.map((f) => ({ ...f, title: ruleTitle(f.rule) })),
    findingsOmitted: analysis.findingsOmitted,
  };
}

export type TraceReport = ReturnType<typeof buildReport>;

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export function diagnosisMail(options: { to: string; senderName: string; note?: string; report: TraceReport; shared?: { url: string; expiresAt: Date } }): OutgoingMail {
  const { report, senderName, note } = options;
  const t = report.trace;
  const listed = report.findings.slice(0, MAIL_FINDINGS);
  const more = report.findings.length - listed.length + report.findingsOmitted;
  const about = [t.device ? `Device: ${t.device}` : '', t.customerRef ? `Customer reference: ${t.customerRef}` : '', `File: ${t.fileName}`].filter(Boolean);
  const contracts = report.contracts.length > 0 ? report.contracts.map(contractLine) : ['No contract was reached.'];
  const count = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;
  const findingLines = listed.map((f) => `[${f.severity}] ${f.rule}${f.t === undefined ? '' : ` at ${seconds(f.t)}`}: ${f.message}`);

  const text = [
    'Hello,',
    `${senderName} shared a diagnosis of the trace "${t.title}" from Parley.`,
    ...(note ? [`Note from ${senderName}:\n${note}`] : []),
    about.join('\n'),
    `Summary: ${report.summary}`,
    `Contracts:\n${contracts.map((c) => `- ${c}`).join('\n')}`,
    `Findings (${count(report.counts.error, 'error')}, ${count(report.counts.warning, 'warning')}, ${report.counts.info} info):\n${findingLines.length > 0 ? findingLines.map((l) => `- ${l}`).join('\n') : '- none'}${more > 0 ? `\n- … and ${more} more on the trace page` : ''}`,
    ...(options.shared ? [`Read the report (no account needed, until ${options.shared.expiresAt.toISOString().slice(0, 10)}): ${options.shared.url}`] : []),
    `Open the trace (for people of your team with a Parley account): ${t.link}`,
    'Parley simulates and analyses; real adapters deliver up to 48 V and 5 A. Defer to the USB PD specification and certified test labs.',
    '— Parley',
  ].join('\n\n');

  const cell = 'style="padding: 4px 8px; border-bottom: 1px solid #e4e7eb; vertical-align: top"';
  const rows = listed
    .map(
      (f) =>
        `<tr><td ${cell}><strong>${escapeHtml(f.severity)}</strong></td><td ${cell}><code>${escapeHtml(f.rule)}</code><br><span style="color: #616e7c">${escapeHtml(f.title)}</span></td><td ${cell}>${escapeHtml(seconds(f.t))}</td><td ${cell}>${escapeHtml(f.message)}</td></tr>`,
    )
    .join('\n');
  const html = [
    '<!doctype html><html><body style="font-family: sans-serif; line-height: 1.5; color: #1f2933">',
    '<p>Hello,</p>',
    `<p>${escapeHtml(senderName)} shared a diagnosis of the trace <strong>${escapeHtml(t.title)}</strong> from Parley.</p>`,
    note ? `<blockquote style="border-left: 3px solid #f59e0b; margin: 0; padding-left: 12px">${escapeHtml(note).replace(/\n/g, '<br>')}</blockquote>` : '',
    `<p>${about.map(escapeHtml).join('<br>')}</p>`,
    `<p><strong>Summary:</strong> ${escapeHtml(report.summary)}</p>`,
    `<h3 style="font-size: 1em">Contracts</h3><ul>${contracts.map((c) => `<li>${escapeHtml(c)}</li>`).join('')}</ul>`,
    `<h3 style="font-size: 1em">Findings</h3>`,
    listed.length > 0
      ? `<table style="border-collapse: collapse; font-size: 0.92em"><thead><tr><th align="left">Severity</th><th align="left">Rule</th><th align="left">Time</th><th align="left">What happened</th></tr></thead><tbody>${rows}</tbody></table>`
      : '<p>No findings.</p>',
    more > 0 ? `<p>… and ${more} more on the trace page.</p>` : '',
    options.shared ? `<p><a href="${escapeHtml(options.shared.url)}"><strong>Read the report</strong></a> (no account needed, until ${options.shared.expiresAt.toISOString().slice(0, 10)})</p>` : '',
    `<p><a href="${escapeHtml(t.link)}">Open the trace in Parley</a> (for people of your team with an account)</p>`,
    '<p style="color: #616e7c; font-size: 0.9em">Parley simulates and analyses; real adapters deliver up to 48 V and 5 A. Defer to the USB PD specification and certified test labs.</p>',
    '<p>— Parley</p>',
    '</body></html>',
  ]
    .filter(Boolean)
    .join('\n');
  return { to: options.to, subject: `Parley diagnosis: ${t.title}`, text, html };
}
