import { createInterface } from 'node:readline';

/**
 * A password from standard input, never from the command line (where other users and the shell's
 * history would see it): asked twice without echo at a terminal, else the first line piped in.
 */
export async function readPassword(): Promise<string | undefined> {
  if (!process.stdin.isTTY) {
    let text = '';
    for await (const chunk of process.stdin) text += chunk;
    return text.split(/\r?\n/)[0];
  }
  const first = await askHidden('password: ');
  const again = await askHidden('the same password again: ');
  return first === again ? first : undefined;
}

function askHidden(question: string): Promise<string> {
  return new Promise((done) => {
    const rl = createInterface({ input: process.stdin, output: process.stderr, terminal: true });
    // Echo nothing of what is typed.
    (rl as unknown as { _writeToOutput: (s: string) => void })._writeToOutput = () => undefined;
    process.stderr.write(question);
    rl.question('', (answer) => {
      rl.close();
      process.stderr.write('\n');
      done(answer);
    });
  });
}
