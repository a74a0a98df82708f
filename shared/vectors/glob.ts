/**
 * `--filter <glob>` on vector ids (../shared/contract/cli.md): `*` matches within one `/`-separated
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

/** True when the id matches the glob. */
export function matchesGlob(id: string, glob: string): boolean {
  return globToRegExp(glob).test(id);
}
