/**
 * Splits a stream of text chunks into lines without holding more than one partial line:
 * the readers' common front. `\r\n` and `\n` both end a line; line numbers are 1-based.
 */
export interface LineSplitter {
  push(chunk: string): void;
  end(): void;
}

/**
 * Lines as ranges of the text they stand in (`text.slice(start, end)` is the line, without its
 * `\r`), so a reader that scans characters need not copy each line first. A line broken across
 * two chunks arrives as a string of its own.
 */
export function createRangeSplitter(onLine: (text: string, start: number, end: number, lineNo: number) => void): LineSplitter {
  let carry = '';
  let lineNo = 0;
  const emit = (text: string, start: number, end: number): void => {
    lineNo++;
    onLine(text, start, end > start && text.charCodeAt(end - 1) === 13 ? end - 1 : end, lineNo);
  };
  return {
    push(chunk) {
      let start = 0;
      let nl = chunk.indexOf('\n');
      if (nl === -1) {
        carry += chunk;
        return;
      }
      if (carry.length > 0) {
        const line = carry + chunk.slice(0, nl);
        emit(line, 0, line.length);
        carry = '';
        start = nl + 1;
        nl = chunk.indexOf('\n', start);
      }
      while (nl !== -1) {
        emit(chunk, start, nl);
        start = nl + 1;
        nl = chunk.indexOf('\n', start);
      }
      carry = chunk.slice(start);
    },
    end() {
      if (carry.length > 0) emit(carry, 0, carry.length);
      carry = '';
    },
  };
}

/** Lines as strings of their own. */
export function createLineSplitter(onLine: (line: string, lineNo: number) => void): LineSplitter {
  return createRangeSplitter((text, start, end, lineNo) => onLine(start === 0 && end === text.length ? text : text.slice(start, end), lineNo));
}
