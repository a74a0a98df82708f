import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { toJunitXml } from './junit.ts';

// JUnit XML as CI servers read it (common practice: <testsuites>/<testsuite>/<testcase>/<failure>),
// checked by parsing with fast-xml-parser.
describe('toJunitXml', () => {
  const xml = toJunitXml([
    { id: 'decode/control/accept', ok: true, durationMs: 1.5 },
    { id: 'caps/power-rules/45w', ok: false, durationMs: 12, message: 'expect.findings.include: expected rule "a<b" & "c" to fire' },
  ]);

  it('is well-formed XML', () => {
    expect(XMLValidator.validate(xml)).toBe(true);
  });

  it('has one testcase per vector and a failure with the message', () => {
    const doc = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(xml);
    const suite = doc.testsuites.testsuite;
    expect(suite.tests).toBe('2');
    expect(suite.failures).toBe('1');
    expect(suite.testcase).toHaveLength(2);
    expect(suite.testcase[0]).toMatchObject({ name: 'decode/control/accept', classname: 'decode/control', time: '0.002' });
    expect(suite.testcase[1].failure.message).toBe('expect.findings.include: expected rule "a<b" & "c" to fire');
  });
});
