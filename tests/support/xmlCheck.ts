/**
 * A small strict XML 1.0 well-formedness check for the tests (no XML parser
 * is installed): one root element, properly nested and closed tags, quoted
 * attributes without duplicates or raw `<`, only the predefined or numeric
 * entity references, nothing but whitespace outside the root, and no
 * DOCTYPE (the SVG files never need one). Returns the first problem, or null.
 */
const NAME = /^[A-Za-z_:][-A-Za-z0-9_:.]*/;
const REF = /^&(?:amp|lt|gt|quot|apos|#[0-9]+|#x[0-9A-Fa-f]+);/;

function checkText(text: string, where: number): string | null {
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === "<") return `raw < at ${where + i}`;
    if (ch === "&" && !REF.test(text.slice(i))) return `bad entity reference at ${where + i}`;
    const code = text.charCodeAt(i);
    if (code < 0x20 && code !== 0x9 && code !== 0xa && code !== 0xd) return `control character ${code} at ${where + i}`;
  }
  return null;
}

export function xmlProblem(doc: string): string | null {
  let i = 0;
  const stack: string[] = [];
  let rootSeen = false;
  if (doc.startsWith("<?xml")) {
    const end = doc.indexOf("?>");
    if (end < 0) return "unterminated XML declaration";
    i = end + 2;
  }
  while (i < doc.length) {
    const lt = doc.indexOf("<", i);
    const text = doc.slice(i, lt < 0 ? doc.length : lt);
    if (stack.length === 0 && text.trim() !== "") return `text outside the root at ${i}`;
    const bad = checkText(text, i);
    if (bad) return bad;
    if (lt < 0) break;
    i = lt;
    if (doc.startsWith("<!--", i)) {
      const end = doc.indexOf("-->", i + 4);
      if (end < 0) return "unterminated comment";
      if (doc.slice(i + 4, end).includes("--")) return "-- inside a comment";
      i = end + 3;
      continue;
    }
    if (doc.startsWith("<![CDATA[", i)) {
      if (stack.length === 0) return "CDATA outside the root";
      const end = doc.indexOf("]]>", i);
      if (end < 0) return "unterminated CDATA";
      i = end + 3;
      continue;
    }
    if (doc.startsWith("<?", i)) {
      const end = doc.indexOf("?>", i);
      if (end < 0) return "unterminated processing instruction";
      i = end + 2;
      continue;
    }
    if (doc.startsWith("<!", i)) return `declaration not allowed at ${i}`;
    if (doc.startsWith("</", i)) {
      const m = NAME.exec(doc.slice(i + 2));
      if (!m) return `bad end tag at ${i}`;
      let j = i + 2 + m[0].length;
      while (/\s/.test(doc[j] ?? "")) j++;
      if (doc[j] !== ">") return `bad end tag at ${i}`;
      const open = stack.pop();
      if (open !== m[0]) return `</${m[0]}> closes <${open ?? "nothing"}> at ${i}`;
      i = j + 1;
      continue;
    }
    const m = NAME.exec(doc.slice(i + 1));
    if (!m) return `bad start tag at ${i}`;
    if (stack.length === 0 && rootSeen) return `second root element at ${i}`;
    rootSeen = true;
    let j = i + 1 + m[0].length;
    const attrs = new Set<string>();
    for (;;) {
      const ws = /^\s*/.exec(doc.slice(j))?.[0].length ?? 0;
      j += ws;
      if (doc.startsWith("/>", j)) {
        j += 2;
        break;
      }
      if (doc[j] === ">") {
        stack.push(m[0]);
        j += 1;
        break;
      }
      if (ws === 0) return `attributes must be separated by whitespace at ${j}`;
      const a = NAME.exec(doc.slice(j));
      if (!a) return `bad attribute at ${j}`;
      if (attrs.has(a[0])) return `duplicate attribute ${a[0]} at ${j}`;
      attrs.add(a[0]);
      j += a[0].length;
      const eq = /^\s*=\s*/.exec(doc.slice(j));
      if (!eq) return `attribute ${a[0]} has no value at ${j}`;
      j += eq[0].length;
      const q = doc[j];
      if (q !== '"' && q !== "'") return `unquoted attribute ${a[0]} at ${j}`;
      const end = doc.indexOf(q, j + 1);
      if (end < 0) return `unterminated attribute ${a[0]}`;
      const problem = checkText(doc.slice(j + 1, end), j + 1);
      if (problem) return `in attribute ${a[0]}: ${problem}`;
      j = end + 1;
    }
    i = j;
  }
  if (stack.length > 0) return `unclosed <${stack[stack.length - 1]}>`;
  if (!rootSeen) return "no root element";
  return null;
}
