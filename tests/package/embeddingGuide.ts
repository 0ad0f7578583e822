// Reads the README's embedding guide so that tests run its code exactly as written: the guide
// and the packed-consumer test cannot drift apart.

/** The code of the README section "Embedding Foldlens in your map". */
export interface EmbeddingGuide {
  /** The `npm install ...` line of the `sh` block. */
  readonly install: string;
  /** The `html` block: the host's index.html. */
  readonly html: string;
  /** The `js` block: the host's main.js. */
  readonly js: string;
}

export const GUIDE_HEADING = '## Embedding Foldlens in your map';

/**
 * Extracts the guide's one `sh`, one `html` and one `js` fenced block.
 * @example embeddingGuide(readFileSync('README.md', 'utf8')).js // the host's main.js
 */
export function embeddingGuide(readme: string): EmbeddingGuide {
  const start = readme.indexOf(`\n${GUIDE_HEADING}\n`);
  if (start < 0) throw new Error(`README.md has no section "${GUIDE_HEADING}"`);
  const rest = readme.slice(start + GUIDE_HEADING.length + 2);
  const next = rest.search(/^## /m);
  const section = next < 0 ? rest : rest.slice(0, next);
  const blocks = new Map<string, string[]>();
  for (const m of section.matchAll(/^```(\w*)\n([\s\S]*?)^```\s*$/gm)) {
    blocks.set(m[1], [...(blocks.get(m[1]) ?? []), m[2]]);
  }
  const one = (lang: string): string => {
    const found = blocks.get(lang) ?? [];
    if (found.length !== 1) throw new Error(`README section "${GUIDE_HEADING}": expected one \`\`\`${lang} block, found ${found.length}`);
    return found[0];
  };
  const installs = one('sh')
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line.startsWith('npm install'));
  if (installs.length !== 1) throw new Error(`README section "${GUIDE_HEADING}": the sh block should hold one "npm install" line, found ${installs.length}`);
  return { install: installs[0], html: one('html'), js: one('js') };
}
