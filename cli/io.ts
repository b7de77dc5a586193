// What a command may touch of the outside world, passed in so tests can swap it.
import { readFileSync } from 'node:fs';

/** Output streams and file reading for one command. */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): string;
}

/** The real process streams and file system. */
export const nodeIo: CliIo = {
  stdout: (text) => void process.stdout.write(text),
  stderr: (text) => void process.stderr.write(text),
  readFile: (path) => readFileSync(path, 'utf8'),
};
