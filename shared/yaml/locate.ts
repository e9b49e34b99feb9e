import { isMap, isScalar, isSeq, LineCounter, parseDocument } from 'yaml'
import type { Document, Node } from 'yaml'

// YAML parsing with line tracking and limits against hostile input, shared by the
// library loader and protocol import.

export interface YamlLimits {
  /** Largest accepted text, in bytes of UTF-8. */
  maxBytes: number
  /** Most alias expansions (guards against "billion laughs"). */
  maxAliasCount: number
  /** Deepest nesting of maps and lists. */
  maxDepth: number
}

export interface YamlProblem {
  line?: number
  column?: number
  /** Dotted path of the field, e.g. tracks.0.blocks.1.hold; empty for the whole text. */
  field: string
  message: string
}

export interface ParsedYaml {
  value: unknown
  doc: Document.Parsed
  lines: LineCounter
}

function utf8Length(text: string): number {
  let n = 0
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i)
    if (c < 0x80) n += 1
    else if (c < 0x800) n += 2
    else if (c >= 0xD800 && c <= 0xDBFF) {
      n += 4
      i++
    }
    else n += 3
  }
  return n
}

/** Nesting depth of flow and block collections, walking the parsed nodes without recursion. */
function depthOf(root: unknown): number {
  let max = 0
  const stack: Array<[unknown, number]> = [[root, 1]]
  while (stack.length) {
    const [node, depth] = stack.pop()!
    if (isMap(node)) {
      max = Math.max(max, depth)
      for (const pair of node.items) stack.push([pair.value, depth + 1])
    }
    else if (isSeq(node)) {
      max = Math.max(max, depth)
      for (const item of node.items) stack.push([item, depth + 1])
    }
  }
  return max
}

/** Deepest [ { nesting outside quotes and comments, found before parsing (the parser recurses). */
function flowDepth(text: string): number {
  let depth = 0
  let max = 0
  let quote = ''
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!
    if (quote) {
      if (c === quote) quote = ''
      else if (c === '\\' && quote === '"') i++
      continue
    }
    if (c === '"' || c === "'") quote = c
    else if (c === '#') {
      const nl = text.indexOf('\n', i)
      i = nl < 0 ? text.length : nl
    }
    else if (c === '[' || c === '{') max = Math.max(max, ++depth)
    else if ((c === ']' || c === '}') && depth > 0) depth--
  }
  return max
}

/** Parses YAML within limits; returns the value or every problem with its line. */
export function parseYaml(text: string, limits: YamlLimits): { ok: true, parsed: ParsedYaml } | { ok: false, problems: YamlProblem[] } {
  const bytes = utf8Length(text)
  if (bytes > limits.maxBytes) {
    return { ok: false, problems: [{ field: '', message: `The YAML is ${bytes} bytes; the most accepted is ${limits.maxBytes}.` }] }
  }
  if (flowDepth(text) > limits.maxDepth) {
    return { ok: false, problems: [{ field: '', message: `The YAML nests more than ${limits.maxDepth} levels deep.` }] }
  }
  const lines = new LineCounter()
  let doc: Document.Parsed
  try {
    doc = parseDocument(text, { lineCounter: lines, prettyErrors: false, uniqueKeys: true, merge: false, strict: true, stringKeys: true })
  }
  catch (error) {
    // A pathological document can exhaust the parser's stack; report it, never crash.
    return { ok: false, problems: [{ field: '', message: `The YAML could not be read: ${error instanceof Error ? error.message : String(error)}` }] }
  }
  const problems: YamlProblem[] = doc.errors.slice(0, 20).map((e) => {
    const pos = lines.linePos(e.pos[0])
    return { line: pos.line, column: pos.col, field: '', message: e.message.split('\n')[0]! }
  })
  if (problems.some(p => /call stack/i.test(p.message))) {
    return { ok: false, problems: [{ field: '', message: `The YAML nests too deeply to read (more than ${limits.maxDepth} levels allowed).` }] }
  }
  if (problems.length) return { ok: false, problems }
  const depth = depthOf(doc.contents)
  if (depth > limits.maxDepth) {
    return { ok: false, problems: [{ field: '', message: `The YAML nests ${depth} levels deep; the most accepted is ${limits.maxDepth}.` }] }
  }
  try {
    const value = doc.toJS({ maxAliasCount: limits.maxAliasCount })
    return { ok: true, parsed: { value, doc, lines } }
  }
  catch (error) {
    return { ok: false, problems: [{ field: '', message: error instanceof Error ? error.message : String(error) }] }
  }
}

/** The node at a path of keys and indexes, as far down as it exists, and whether it was reached. */
function nodeAt(doc: Document.Parsed, path: ReadonlyArray<string | number>): { node: Node | null, keyNode: Node | null, complete: boolean } {
  let node: unknown = doc.contents
  let keyNode: Node | null = null
  for (const step of path) {
    if (isMap(node)) {
      const pair = node.items.find(p => (isScalar(p.key) ? String(p.key.value) : String(p.key)) === String(step))
      if (!pair) return { node: node as Node, keyNode, complete: false }
      keyNode = isScalar(pair.key) ? pair.key : null
      node = pair.value
    }
    else if (isSeq(node)) {
      const item = node.items[Number(step)]
      if (item === undefined) return { node: node as Node, keyNode, complete: false }
      keyNode = null
      node = item
    }
    else {
      return { node: (node ?? null) as Node | null, keyNode, complete: false }
    }
  }
  return { node: (node ?? null) as Node | null, keyNode, complete: true }
}

/** Line and column (from 1) of the value at `path`, or of the closest parent that exists. */
export function locate(parsed: ParsedYaml, path: ReadonlyArray<string | number>, preferKey = false): { line?: number, column?: number } {
  const { node, keyNode } = nodeAt(parsed.doc, path)
  const target = preferKey && keyNode?.range ? keyNode : node?.range ? node : keyNode
  if (!target?.range) return {}
  const pos = parsed.lines.linePos(target.range[0])
  return { line: pos.line, column: pos.col }
}
