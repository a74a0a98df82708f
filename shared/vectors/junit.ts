/**
 * JUnit XML for CI (`parley run --junit <file>`): one `<testsuite>` per run, one `<testcase>` per
 * vector (`classname` = the id's folder part, `name` = the full id), a `<failure>` with the
 * mismatch message for each failing vector. Times are in seconds, as JUnit readers expect.
 */
export interface JunitCase {
  id: string;
  ok: boolean;
  message?: string;
  durationMs: number;
  /** Where the vector came from (a file path), kept as the testcase's `file` attribute. */
  file?: string;
}

function escapeXml(text: string): string {
  return (
    text
      // XML 1.0 forbids most control characters even as references.
      .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f]/g, '')
      .replace(/&/g, '&amp;')
      .replace(/</g, '&lt;')
      .replace(/>/g, '&gt;')
      .replace(/"/g, '&quot;')
  );
}

function seconds(durationMs: number): string {
  return (durationMs / 1_000).toFixed(3);
}

/** The XML document, UTF-8, with a final newline. */
export function toJunitXml(cases: readonly JunitCase[], suiteName = 'parley vectors'): string {
  const failures = cases.filter((c) => !c.ok).length;
  const totalMs = cases.reduce((sum, c) => sum + c.durationMs, 0);
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<testsuites name="${escapeXml(suiteName)}" tests="${cases.length}" failures="${failures}" errors="0" time="${seconds(totalMs)}">`,
    `  <testsuite name="${escapeXml(suiteName)}" tests="${cases.length}" failures="${failures}" errors="0" skipped="0" time="${seconds(totalMs)}">`,
  ];
  for (const c of cases) {
    const slash = c.id.lastIndexOf('/');
    const classname = slash > 0 ? c.id.slice(0, slash) : c.id;
    const file = c.file === undefined ? '' : ` file="${escapeXml(c.file)}"`;
    const open = `    <testcase classname="${escapeXml(classname)}" name="${escapeXml(c.id)}"${file} time="${seconds(c.durationMs)}"`;
    if (c.ok) {
      lines.push(`${open}/>`);
    } else {
      const message = c.message ?? 'failed';
      const firstLine = message.split('\n')[0] ?? message;
      lines.push(`${open}>`, `      <failure message="${escapeXml(firstLine)}" type="mismatch">${escapeXml(message)}</failure>`, '    </testcase>');
    }
  }
  lines.push('  </testsuite>', '</testsuites>', '');
  return lines.join('\n');
}
