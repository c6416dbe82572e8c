import { randomBytes } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

/**
 * A local SMTP server that accepts every message and keeps it as an .eml file in
 * `directory` (the outbox shown by the dev-only page). Loopback only; no TLS, no auth.
 */
export interface SmtpSink {
  port: number;
  directory: string;
  close(): Promise<void>;
}

export async function startSmtpSink(options: {
  port: number;
  directory: string;
  host?: string;
  onMessage?: (file: string) => void;
}): Promise<SmtpSink> {
  mkdirSync(options.directory, { recursive: true });
  const server = new SMTPServer({
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    size: 25 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', callback);
      stream.on('end', () => {
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomBytes(4).toString('hex')}.eml`;
        const file = path.join(options.directory, name);
        writeFile(file, Buffer.concat(chunks)).then(
          () => {
            options.onMessage?.(file);
            callback();
          },
          (error: Error) => callback(error),
        );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, options.host ?? '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (error) => console.error(`[smtp-sink] ${error.message}`));
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;
  return {
    port,
    directory: options.directory,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
