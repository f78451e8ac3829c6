/**
 * The local stand-in for an SMTP relay: MailDev 2.2.1 on loopback, for `npm start` and `npm test`
 * (scripts/lib.sh starts it with `mail_up` and stops it by pid with `mail_down`). Every message
 * the server sends lands in its inbox instead of going out:
 *
 *   node --import tsx scripts/mail-server.ts <smtp port> <web port> <mail directory> [pid file]
 *
 * Read the inbox in a browser at http://127.0.0.1:<web port>/ or through its REST API
 * (`GET /email`, `DELETE /email/all`), which the API tests use. The pid file is written once both
 * ports listen, so the caller knows it is up and which process to stop.
 */
import fs from 'node:fs';
import net from 'node:net';

function listening(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.once('connect', () => { socket.destroy(); resolve(true); });
    socket.once('error', () => resolve(false));
  });
}

async function main() {
  const [smtpText, webText, directory, pidFile] = process.argv.slice(2);
  const smtp = Number(smtpText);
  const web = Number(webText);
  const valid = (p: number) => Number.isInteger(p) && p > 0 && p < 65536;
  if (!valid(smtp) || !valid(web) || !directory) {
    throw new Error('usage: mail-server.ts <smtp port> <web port> <mail directory> [pid file]');
  }
  fs.mkdirSync(directory, { recursive: true });
  // maildev ships no types and is CommonJS
  const MailDev = require('maildev') as (config: Record<string, unknown>) => { listen(): Promise<void> };
  // MailDev's own SIGTERM/SIGINT handler closes both servers and exits; the web inbox listens at
  // once, the SMTP side when asked
  const server = MailDev({ smtp, web, ip: '127.0.0.1', mailDirectory: directory, silent: true, hideExtensions: [] });
  await server.listen();
  for (let i = 0; i < 80; i++) {
    if ((await listening(smtp)) && (await listening(web))) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  if (pidFile) {
    fs.writeFileSync(pidFile, `${process.pid}\n`);
    process.on('exit', () => fs.rmSync(pidFile, { force: true }));
  }
  process.stdout.write(`maildev: SMTP on 127.0.0.1:${smtp}, inbox on http://127.0.0.1:${web}/\n`);
}

main().catch((error: unknown) => {
  process.stderr.write(`mail-server: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
