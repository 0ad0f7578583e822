import { describe, expect, it } from 'vitest';
import ts from 'typescript';
import { fileURLToPath } from 'node:url';

// Every public export of the package entry points carries TSDoc with an @example (house style,
// and what the generated API reference shows). The check reads the declarations through the
// TypeScript compiler, so a re-export chain is followed to the real declaration.
const root = fileURLToPath(new URL('../../', import.meta.url));
const ENTRY_POINTS = ['src/index.ts', 'src/core/index.ts'];

function undocumentedExports(entry: string): { missingDoc: string[]; missingExample: string[]; count: number } {
  const program = ts.createProgram([root + entry], { strict: true, target: ts.ScriptTarget.ES2022, module: ts.ModuleKind.ESNext, moduleResolution: ts.ModuleResolutionKind.Bundler, allowImportingTsExtensions: false, noEmit: true, skipLibCheck: true, types: [] });
  const checker = program.getTypeChecker();
  const source = program.getSourceFile(root + entry);
  if (!source) throw new Error(`${entry} not found`);
  const moduleSymbol = checker.getSymbolAtLocation(source);
  if (!moduleSymbol) throw new Error(`${entry} has no module symbol`);
  const missingDoc: string[] = [];
  const missingExample: string[] = [];
  const exports = checker.getExportsOfModule(moduleSymbol);
  for (const exported of exports) {
    const symbol = exported.flags & ts.SymbolFlags.Alias ? checker.getAliasedSymbol(exported) : exported;
    const declaration = symbol.declarations?.[0];
    if (!declaration) continue;
    // Types and interfaces document themselves through their fields; the rule is for values.
    const isValue = (symbol.flags & (ts.SymbolFlags.Function | ts.SymbolFlags.Class | ts.SymbolFlags.Variable | ts.SymbolFlags.Enum)) !== 0;
    if (!isValue) continue;
    const where = `${exported.name} (${declaration.getSourceFile().fileName.replace(root, '')})`;
    const docs = ts.getJSDocCommentsAndTags(declaration);
    const tags = ts.getJSDocTags(declaration);
    const statementDocs = ts.isVariableDeclaration(declaration) ? ts.getJSDocCommentsAndTags(declaration.parent.parent) : [];
    const statementTags = statementDocs.flatMap((d) => (ts.isJSDoc(d) ? [...(d.tags ?? [])] : []));
    if (docs.length === 0 && statementDocs.length === 0) missingDoc.push(where);
    else if (![...tags, ...statementTags].some((t) => t.tagName.text === 'example')) missingExample.push(where);
  }
  return { missingDoc, missingExample, count: exports.length };
}

describe('public API documentation', () => {
  for (const entry of ENTRY_POINTS) {
    it(`every value exported from ${entry} has TSDoc with an @example`, () => {
      const { missingDoc, missingExample, count } = undocumentedExports(entry);
      expect(count).toBeGreaterThan(20);
      expect({ missingDoc, missingExample }).toEqual({ missingDoc: [], missingExample: [] });
    });
  }
});
