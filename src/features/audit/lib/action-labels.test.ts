import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { actionLabel, labelledActions } from './action-labels.ts';

const serverDir = resolve(fileURLToPath(new URL('../../../../server', import.meta.url)));

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return name.endsWith('.ts') && !name.endsWith('.test.ts') ? [path] : [];
  });
}

/** Every action the server can record: the AuditAction union and each code quoted in a recordAudit( call. */
function recordedActions(): Set<string> {
  const codes = new Set<string>();
  const union = readFileSync(join(serverDir, 'features/audit/record.ts'), 'utf8').match(/export type AuditAction =([^;]+);/);
  for (const [, code] of union?.[1]?.matchAll(/'([a-z_]+\.[a-z_]+)'/g) ?? []) codes.add(code!);
  for (const file of sourceFiles(serverDir)) {
    for (const [call] of readFileSync(file, 'utf8').matchAll(/recordAudit\([^;]*\);/g)) {
      for (const [, code] of call.matchAll(/'([a-z_]+\.[a-z_]+)'/g)) codes.add(code!);
    }
  }
  return codes;
}

describe('audit action labels', () => {
  it('label every action the server records', () => {
    const recorded = recordedActions();
    expect(recorded.size).toBeGreaterThanOrEqual(18);
    expect([...recorded].filter((code) => !labelledActions.includes(code))).toEqual([]);
    expect(labelledActions.filter((code) => !recorded.has(code))).toEqual([]);
  });

  it('reads known codes in plain English and unknown ones as their words', () => {
    expect(actionLabel('auth.sign_in')).toBe('Signed in');
    expect(actionLabel('user.invited')).toBe('Invited a user');
    expect(actionLabel('user.role_changed')).toBe('Changed a role');
    expect(actionLabel('run.started')).toBe('Run started');
  });
});
