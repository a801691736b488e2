// A pino logger whose lines a test can read.
import { Writable } from 'node:stream';
import pino from 'pino';

export function capturedLog() {
  const lines: string[] = [];
  const sink = new Writable({
    write(chunk, _enc, done) {
      lines.push(...String(chunk).split('\n').filter(Boolean));
      done();
    },
  });
  return { lines, log: pino({ level: 'info' }, sink) };
}
