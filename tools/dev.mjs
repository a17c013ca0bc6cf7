// `npm run dev`: the API with restarts on change on :3000 and the app with live reload on :4200.
import { spawn } from 'node:child_process';
import { main, MAILBOX_URL, root, runNode, setUp, startMailSink } from './setup.mjs';

await main(async () => {
  const { databaseUrl } = await setUp();
  runNode(['--import', 'tsx', 'tools/prepare-database.ts'], { DATABASE_URL: databaseUrl });
  const env = { ...process.env, DATABASE_URL: databaseUrl };
  const children = [
    ...(process.env.SMTP_URL ? [] : [startMailSink()]),
    spawn(process.execPath, ['--watch', '--import', 'tsx', 'server/main.ts'], { cwd: root, stdio: 'inherit', env }),
    spawn(process.execPath, ['node_modules/@angular/cli/bin/ng.js', 'serve', '--host', '127.0.0.1'], {
      cwd: root,
      stdio: 'inherit',
      env,
    }),
  ];
  console.log(`\nBenchtide (live reload): http://127.0.0.1:4200  (API on :3000); mailbox: ${MAILBOX_URL}\n`);
  const stopAll = (signal) => children.forEach((child) => child.kill(signal));
  for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => stopAll(signal));
  for (const child of children)
    child.on('exit', () => {
      stopAll('SIGTERM');
      process.exitCode = 1;
    });
});
