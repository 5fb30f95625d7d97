/** Entry point of `npm run -s cli`: see run.ts. Even a failure to load the engine gives one line, never a stack trace. */

// A reader that stops early (`| head`) closes the pipe: that is not an error of ours.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw e;
  });
}

try {
  const { runCli } = await import('./run');
  const { code, stdout, stderr } = await runCli(process.argv.slice(2));
  if (stdout) process.stdout.write(stdout);
  if (stderr) process.stderr.write(stderr);
  process.exitCode = code;
} catch (e) {
  const message = e instanceof Error ? e.message : String(e);
  process.stderr.write(`internal error: ${message.replace(/\s*[\r\n]+\s*/g, ' ')}\n`);
  process.exitCode = 1;
}

export {};
