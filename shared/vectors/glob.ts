/**
 * `--filter <glob>` on vector ids (docs/cli.md): `*` matches within one `/`-separated
 * word, `**` across words (also none: `caps/**` matches `caps` and `caps/a/b`), `?` one character
 * other than `/`. Everything else is literal.
 */
export function globToRegExp(glob: string): RegExp {
  let source = '';
  for (let i = 0; i < glob.length; i += 1) {
    const ch = glob[i] ?? '';
    if (ch === '*' && glob[i + 1] === '*') {
      i += 1;
      if (glob[i + 1] === '/') {
        i += 1;
        source += '(?:.*/)?';
      } else if (source.endsWith('/')) {
        source = `${source.slice(0, -1)}(?:/.*)?`;
      } else {
        source += '.*';
      }
    } else if (ch === '*') source += '[^/]*';
    else if (ch === '?') source += '[^/]';
    else source += ch.replace(/[.+^${}()|[\]\\]/g, '\\$&');
  }
  return new RegExp(`^${source}$`);
}

type GlobToken = { kind: 'char'; ch: string } | { kind: 'one' | 'word' | 'any' | 'dirs' | 'rest' };

/** The glob as tokens, with the meanings `globToRegExp` gives them. */
function tokenize(glob: string): GlobToken[] {
  const tokens: GlobToken[] = [];
  for (let i = 0; i < glob.length; i += 1) {
    const ch = glob[i] ?? '';
    if (ch === '*' && glob[i + 1] === '*') {
      i += 1;
      const last = tokens[tokens.length - 1];
      if (glob[i + 1] === '/') {
        i += 1;
        tokens.push({ kind: 'dirs' }); // `**/`: nothing, or anything ending in `/`
      } else if (last?.kind === 'char' && last.ch === '/') {
        tokens[tokens.length - 1] = { kind: 'rest' }; // `/**`: nothing, or `/` and anything
      } else tokens.push({ kind: 'any' });
    } else if (ch === '*') tokens.push({ kind: 'word' });
    else if (ch === '?') tokens.push({ kind: 'one' });
    else tokens.push({ kind: 'char', ch });
  }
  return tokens;
}

/** What a regular expression's `.` matches. */
const isDot = (ch: string) => ch !== '\n' && ch !== '\r' && ch !== '\u2028' && ch !== '\u2029';

/**
 * True when the id matches the glob. Matched by one pass per token over the id's positions rather
 * than through `globToRegExp`: a backtracking engine takes exponential time on globs like
 * `*a*a*a…b` (18 `*a` took 110 s on a 36-character id), and a filter is user input.
 */
export function matchesGlob(id: string, glob: string): boolean {
  const n = id.length;
  let reach: boolean[] = Array.from({ length: n + 1 }, (_, k) => k === 0);
  for (const token of tokenize(glob)) {
    const next: boolean[] = new Array<boolean>(n + 1).fill(false);
    let carry = false; // `any`/`dirs`: some reached start with only `.` since; `rest`: the same after a `/`
    for (let k = 0; k <= n; k += 1) {
      const prev = k > 0 ? (id[k - 1] ?? '') : '';
      const reachedBefore = k > 0 && reach[k - 1] === true;
      switch (token.kind) {
        case 'char':
          next[k] = reachedBefore && prev === token.ch;
          break;
        case 'one':
          next[k] = reachedBefore && prev !== '/';
          break;
        case 'word':
          next[k] = reach[k] === true || (k > 0 && next[k - 1] === true && prev !== '/');
          break;
        case 'any':
          next[k] = reach[k] === true || (k > 0 && next[k - 1] === true && isDot(prev));
          break;
        case 'dirs':
          next[k] = reach[k] === true || (carry && prev === '/');
          carry = reach[k] === true || (carry && isDot(prev)) || (carry && prev === '/');
          break;
        case 'rest':
          carry = (reachedBefore && prev === '/') || (carry && isDot(prev));
          next[k] = reach[k] === true || carry;
          break;
      }
    }
    reach = next;
  }
  return reach[n] === true;
}
