/**
 * The client's heavy libraries and the chunk each is built into (vite.config.ts), so the
 * first page never loads them. `npm run bench -- client` checks the build against this list.
 * `test` matches module paths under node_modules.
 */
export interface HeavyChunk {
  /** Chunk name (the file is `assets/<name>-<hash>.js`). */
  name: string;
  /** What a reader of the bench output calls it. */
  label: string;
  test: RegExp;
}

const pkg = (names: string) => new RegExp(`[\\\\/]node_modules[\\\\/](?:${names})[\\\\/]`);

export const HEAVY_CHUNKS: HeavyChunk[] = [
  { name: 'vega', label: 'vega / vega-lite (charts)', test: pkg('vega|vega-[^\\\\/]+|react-vega|d3-[^\\\\/]+|internmap|delaunator|robust-predicates|topojson-client|json-stringify-pretty-compact') },
  { name: 'editor', label: 'TipTap / ProseMirror (editor)', test: pkg('@tiptap[\\\\/][^\\\\/]+|prosemirror-[^\\\\/]+|orderedmap|rope-sequence|w3c-keyname|linkifyjs|fast-equals') },
  { name: 'katex', label: 'KaTeX (maths typesetting)', test: pkg('katex') },
  { name: 'mathjs', label: 'mathjs (expression parsing)', test: pkg('mathjs|decimal\\.js|complex\\.js|fraction\\.js|typed-function|seedrandom|escape-latex|javascript-natural-sort') },
];
