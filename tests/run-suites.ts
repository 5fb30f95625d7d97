// Runs every suite in turn and prints one total. Each suite's own output streams through.
import { spawn } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';

interface Suite {
  name: string;
  command: string;
  /** Reads passed / failed counts from the suite's output (or its report file). */
  count(output: string, exitCode: number): { passed: number; failed: number };
}

const nodeTap = (output: string, code: number) => {
  const pass = Number(/^# pass (\d+)/m.exec(output)?.[1] ?? 0);
  const fail = Number(/^# fail (\d+)/m.exec(output)?.[1] ?? 0);
  return { passed: pass, failed: fail || (code !== 0 ? 1 : 0) };
};

const dbName = process.env['DB_NAME'] ?? 'ripplehall_test';
const suites: Suite[] = [
  {
    name: 'lint',
    command: 'npm run -s lint',
    count: (_o, code) => (code === 0 ? { passed: 1, failed: 0 } : { passed: 0, failed: 1 }),
  },
  {
    // tsx strips types without checking them, so a type error in the server would pass the other suites.
    // The strict check adds noUncheckedIndexedAccess everywhere but the engine (DEVELOPERS.md, "Type checks").
    name: 'types',
    command: 'npm run -s typecheck',
    count: (_o, code) => (code === 0 ? { passed: 1, failed: 0 } : { passed: 0, failed: 1 }),
  },
  {
    name: 'engine',
    command: "node --import tsx --test --test-reporter=tap $(find tests/engine -name '*.test.ts' | sort)",
    count: nodeTap,
  },
  {
    name: 'server',
    command: `DB_NAME=${dbName} bash scripts/test-db.sh && node --import tsx --test --test-concurrency=1 --test-timeout=300000 --test-reporter=tap $(find tests/server -name '*.test.ts' | sort)`,
    count: nodeTap,
  },
  {
    // Two web and two worker processes with their own MariaDB and Redis; kill -9 of each mid-rehearsal.
    name: 'faults',
    command: 'FAULTS_REPORTER=tap bash scripts/faults.sh',
    count: nodeTap,
  },
  {
    name: 'client (Karma)',
    command: 'npx ng test --watch=false --no-progress',
    count: (output, code) => {
      const line = [...output.matchAll(/Executed (\d+) of (\d+)(?: \((\d+) FAILED\))?/g)].pop();
      if (!line) return { passed: 0, failed: 1 };
      const failed = Number(line[3] ?? 0);
      return { passed: Number(line[1]) - failed, failed: failed || (code !== 0 ? 1 : 0) };
    },
  },
  {
    name: 'end-to-end (Playwright)',
    command: `rm -f test-results/e2e.json; npx ng build --configuration production >/dev/null && DB_NAME=${dbName}_e2e bash scripts/test-db.sh && DB_NAME=${dbName}_e2e npx playwright test`,
    count: (_o, code) => {
      try {
        const report = JSON.parse(readFileSync('test-results/e2e.json', 'utf8'));
        const s = report.stats;
        return { passed: s.expected + (s.flaky ?? 0), failed: s.unexpected || (code !== 0 ? 1 : 0) };
      } catch {
        return { passed: 0, failed: 1 };
      }
    },
  },
];

function run(suite: Suite): Promise<{ passed: number; failed: number }> {
  return new Promise((resolve) => {
    console.log(`\n=== ${suite.name} ===`);
    const child = spawn('bash', ['-c', suite.command], { stdio: ['ignore', 'pipe', 'pipe'], env: process.env });
    let output = '';
    child.stdout.on('data', (d: Buffer) => {
      output += d;
      process.stdout.write(d);
    });
    child.stderr.on('data', (d: Buffer) => {
      output += d;
      process.stderr.write(d);
    });
    child.on('close', (code) => resolve(suite.count(output, code ?? 1)));
  });
}

const only = process.argv.slice(2);
rmSync('test-results/summary.txt', { force: true });
let passed = 0;
let failed = 0;
const lines: string[] = [];
for (const suite of suites) {
  if (only.length && !only.some((o) => suite.name.startsWith(o))) continue;
  const r = await run(suite);
  passed += r.passed;
  failed += r.failed;
  lines.push(`${suite.name.padEnd(26)} ${r.passed} passed, ${r.failed} failed`);
}
console.log('\n=== summary ===');
for (const l of lines) console.log(l);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
