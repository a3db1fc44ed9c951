import { createInterface } from 'node:readline';
import type { Readable } from 'node:stream';
import { parseReadingLine, type Captured, type CounterSource, type SourceContext } from './counter-source.js';

/** Standard input, one reading a line; ends when the input ends. */
export class StdinSource implements CounterSource {
  readonly label = 'standard input';
  skipped = 0;
  private closeInput: (() => void) | null = null;

  constructor(private readonly input: Readable = process.stdin) {}

  run(emit: (reading: Captured) => void, context: SourceContext): Promise<void> {
    return new Promise((resolve) => {
      const lines = createInterface({ input: this.input, crlfDelay: Infinity });
      let lineNo = 0;
      this.closeInput = () => lines.close();
      lines.on('line', (line) => {
        lineNo++;
        try {
          const reading = parseReadingLine(line, context.attach.dataKind);
          if (reading) emit(reading);
        } catch (error) {
          this.skipped++;
          context.warn(`line ${lineNo} skipped: ${error instanceof Error ? error.message : String(error)}`);
        }
      });
      lines.once('close', () => resolve());
    });
  }

  stop(): void {
    this.closeInput?.();
  }
}
