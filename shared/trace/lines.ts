/**
 * Splits a stream of text chunks into lines without holding more than one partial line:
 * the readers' common front. `\r\n` and `\n` both end a line; line numbers are 1-based.
 */
export interface LineSplitter {
  push(chunk: string): void;
  end(): void;
}

export function createLineSplitter(onLine: (line: string, lineNo: number) => void): LineSplitter {
  let carry = '';
  let lineNo = 0;
  const emit = (line: string): void => {
    lineNo++;
    onLine(line.charCodeAt(line.length - 1) === 13 ? line.slice(0, -1) : line, lineNo);
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
        emit(carry + chunk.slice(0, nl));
        carry = '';
        start = nl + 1;
        nl = chunk.indexOf('\n', start);
      }
      while (nl !== -1) {
        emit(chunk.slice(start, nl));
        start = nl + 1;
        nl = chunk.indexOf('\n', start);
      }
      carry = chunk.slice(start);
    },
    end() {
      if (carry.length > 0) emit(carry);
      carry = '';
    },
  };
}
