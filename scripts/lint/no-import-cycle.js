// @ts-check
/**
 * ESLint rule: a module may not take part in a cycle of static imports. The graph is built once
 * per lint run with the TypeScript parser over the folders below; `import type` / `export type`
 * (erased at run time) and dynamic `import()` (loaded later, on purpose) are not edges.
 */
import fs from 'node:fs';
import path from 'node:path';
import ts from 'typescript';

const ROOTS = ['server', 'shared', 'db', 'config', 'seed-data'];

/** @type {{ root: string, edges: Map<string, string[]>, component: Map<string, number> } | undefined} */
let graph;

function tsFiles(dir) {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((d) => {
    const full = path.join(dir, d.name);
    if (d.isDirectory()) return d.name === 'node_modules' ? [] : tsFiles(full);
    return d.name.endsWith('.ts') && !d.name.endsWith('.d.ts') ? [full] : [];
  });
}

function resolve(from, spec) {
  if (!spec.startsWith('.')) return undefined;
  const base = path.resolve(path.dirname(from), spec.replace(/\.js$/, ''));
  for (const candidate of [base, `${base}.ts`, path.join(base, 'index.ts')]) {
    if (candidate.endsWith('.ts') && fs.existsSync(candidate)) return candidate;
  }
  return undefined;
}

/** The runtime imports of one file: static import / export-from declarations that are not type-only. */
function importsOf(file) {
  const source = ts.createSourceFile(file, fs.readFileSync(file, 'utf8'), ts.ScriptTarget.Latest, false, ts.ScriptKind.TS);
  const out = [];
  for (const node of source.statements) {
    if (ts.isImportDeclaration(node)) {
      const clause = node.importClause;
      if (clause?.isTypeOnly) continue;
      const named = clause?.namedBindings;
      const onlyTypes =
        clause &&
        !clause.name &&
        named &&
        ts.isNamedImports(named) &&
        named.elements.length > 0 &&
        named.elements.every((e) => e.isTypeOnly);
      if (onlyTypes) continue;
      out.push(/** @type {ts.StringLiteral} */ (node.moduleSpecifier).text);
    } else if (ts.isExportDeclaration(node) && node.moduleSpecifier) {
      if (node.isTypeOnly) continue;
      const named = node.exportClause;
      if (named && ts.isNamedExports(named) && named.elements.length > 0 && named.elements.every((e) => e.isTypeOnly)) continue;
      out.push(/** @type {ts.StringLiteral} */ (node.moduleSpecifier).text);
    }
  }
  return out;
}

/** Tarjan's strongly connected components; a component of more than one file is a cycle. */
function buildGraph(root) {
  const files = ROOTS.flatMap((r) => tsFiles(path.join(root, r)));
  const edges = new Map(files.map((f) => [f, importsOf(f).flatMap((s) => resolve(f, s) ?? [])]));
  const index = new Map();
  const low = new Map();
  const stack = [];
  const onStack = new Set();
  const component = new Map();
  let next = 0;
  let components = 0;
  const visit = (start) => {
    // Iterative, so a long import chain cannot overflow the stack.
    const work = [[start, 0]];
    index.set(start, next);
    low.set(start, next++);
    stack.push(start);
    onStack.add(start);
    while (work.length) {
      const top = work[work.length - 1];
      const [v, i] = top;
      const targets = edges.get(v) ?? [];
      if (i < targets.length) {
        top[1] = i + 1;
        const w = targets[i];
        if (!index.has(w)) {
          index.set(w, next);
          low.set(w, next++);
          stack.push(w);
          onStack.add(w);
          work.push([w, 0]);
        } else if (onStack.has(w)) low.set(v, Math.min(low.get(v), index.get(w)));
        continue;
      }
      work.pop();
      if (work.length) {
        const parent = work[work.length - 1][0];
        low.set(parent, Math.min(low.get(parent), low.get(v)));
      }
      if (low.get(v) === index.get(v)) {
        const members = [];
        let w;
        do {
          w = stack.pop();
          onStack.delete(w);
          members.push(w);
        } while (w !== v);
        if (members.length > 1) for (const m of members) component.set(m, components);
        components++;
      }
    }
  };
  for (const f of files) if (!index.has(f)) visit(f);
  return { root, edges, component };
}

/** The shortest import path from `file` back to itself, for the message. */
function cycleThrough(g, file) {
  const same = g.component.get(file);
  const previous = new Map([[file, '']]);
  const queue = [file];
  while (queue.length) {
    const v = queue.shift();
    for (const w of g.edges.get(v) ?? []) {
      if (g.component.get(w) !== same) continue;
      if (w === file) {
        const chain = [v];
        for (let at = v; previous.get(at); at = previous.get(at)) chain.unshift(previous.get(at));
        return [...chain, file].map((f) => path.relative(g.root, f));
      }
      if (!previous.has(w)) {
        previous.set(w, v);
        queue.push(w);
      }
    }
  }
  return [path.relative(g.root, file)];
}

/** @type {import('eslint').Rule.RuleModule} */
export const noImportCycle = {
  meta: { type: 'problem', docs: { description: 'forbid cycles of runtime imports' }, schema: [] },
  create(context) {
    return {
      Program(node) {
        const file = context.filename;
        const root = context.cwd;
        if (!graph || graph.root !== root) graph = buildGraph(root);
        if (!graph.component.has(file)) return;
        context.report({
          node,
          message: `Import cycle: ${cycleThrough(graph, file).join(' -> ')}. Break it (move the shared piece down a layer).`,
        });
      },
    };
  },
};
