// @ts-check
/**
 * ESLint rule: every relative import of a file stays inside one folder (option `root`, from the
 * project root), e.g. the engine (shared/engine) imports nothing of the project outside itself.
 * Packages and node: built-ins are not relative and are left to other rules.
 */
import path from 'node:path';

/** @type {import('eslint').Rule.RuleModule} */
export const importsWithin = {
  meta: {
    type: 'problem',
    docs: { description: 'relative imports stay inside a folder' },
    schema: [{ type: 'object', properties: { root: { type: 'string' }, message: { type: 'string' } }, required: ['root'] }],
  },
  create(context) {
    const { root, message } = context.options[0];
    const inside = path.resolve(context.cwd, root) + path.sep;
    const check = (node, source) => {
      if (!source || typeof source.value !== 'string' || !source.value.startsWith('.')) return;
      const target = path.resolve(path.dirname(context.filename), source.value);
      if (!(target + path.sep).startsWith(inside)) {
        context.report({ node, message: `${source.value} is outside ${root}. ${message ?? ''}`.trim() });
      }
    };
    return {
      ImportDeclaration: (node) => check(node, node.source),
      ExportNamedDeclaration: (node) => check(node, node.source),
      ExportAllDeclaration: (node) => check(node, node.source),
      ImportExpression: (node) => check(node, node.source.type === 'Literal' ? node.source : null),
    };
  },
};
