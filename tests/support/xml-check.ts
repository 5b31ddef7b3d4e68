// A strict, small XML well-formedness checker of our own (no dependency), enough for the SVG ambit writes: an
// optional XML declaration, one root element, properly nested start/end tags, attributes written name="value" or
// name='value' once each, no '<' or stray '&' in text or values, entity references limited to the five predefined
// ones and numeric character references (XML 1.0, W3C Recommendation, sections 2.1, 2.4, 3.1, 4.1; from memory).
// Comments, CDATA, processing instructions and DOCTYPEs are reported as unsupported rather than skipped.

export interface XmlElement { name: string; attributes: Map<string, string>; children: XmlElement[]; text: string }

const NAME = /^[A-Za-z_:][-A-Za-z0-9_:.]*/;
const ENTITY = /^&(?:amp|lt|gt|quot|apos|#[0-9]+|#x[0-9A-Fa-f]+);/;

function decode(s: string, where: string): string {
  for (let i = s.indexOf('&'); i >= 0; i = s.indexOf('&', i + 1)) {
    if (!ENTITY.test(s.slice(i))) throw new Error(`${where}: bad entity reference at '${s.slice(i, i + 10)}'`);
  }
  return s.replace(/&(amp|lt|gt|quot|apos);/g, (_, e: string) => ({ amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" })[e]!)
    .replace(/&#x([0-9A-Fa-f]+);/g, (_, h: string) => String.fromCodePoint(parseInt(h, 16)))
    .replace(/&#([0-9]+);/g, (_, d: string) => String.fromCodePoint(Number(d)));
}

/** Parses well-formed XML into its root element; throws an Error describing the first violation. */
export function parseXml(text: string): XmlElement {
  let i = 0;
  if (text.startsWith('<?xml')) {
    const end = text.indexOf('?>');
    if (end < 0) throw new Error('unterminated XML declaration');
    i = end + 2;
  }
  const stack: XmlElement[] = [];
  let root: XmlElement | null = null;
  while (i < text.length) {
    const lt = text.indexOf('<', i);
    const chunk = lt < 0 ? text.slice(i) : text.slice(i, lt);
    if (stack.length === 0) {
      if (chunk.trim() !== '') throw new Error(`text outside the root element: '${chunk.trim().slice(0, 20)}'`);
    } else {
      if (chunk.includes('>') && chunk.includes(']]>')) throw new Error("']]>' in text");
      stack[stack.length - 1].text += decode(chunk, `text in <${stack[stack.length - 1].name}>`);
    }
    if (lt < 0) break;
    i = lt + 1;
    if (text[i] === '!' || text[i] === '?') throw new Error(`unsupported markup '<${text.slice(i, i + 8)}'`);
    if (text[i] === '/') {
      const m = NAME.exec(text.slice(i + 1));
      if (!m) throw new Error(`bad end tag at ${lt}`);
      const open = stack.pop();
      if (!open || open.name !== m[0]) throw new Error(`end tag </${m[0]}> does not match <${open?.name ?? '(none)'}>`);
      i += 1 + m[0].length;
      while (text[i] === ' ' || text[i] === '\n' || text[i] === '\t' || text[i] === '\r') i++;
      if (text[i] !== '>') throw new Error(`bad end tag </${m[0]}`);
      i++;
      continue;
    }
    const m = NAME.exec(text.slice(i));
    if (!m) throw new Error(`bad tag name at ${lt}`);
    if (root !== null && stack.length === 0) throw new Error(`a second root element <${m[0]}>`);
    const el: XmlElement = { name: m[0], attributes: new Map(), children: [], text: '' };
    i += m[0].length;
    for (;;) {
      const ws = /^[ \t\r\n]*/.exec(text.slice(i))![0].length;
      i += ws;
      if (text.startsWith('/>', i)) { i += 2; break; }
      if (text[i] === '>') { i++; stack.push(el); break; }
      if (ws === 0) throw new Error(`<${el.name}>: attributes must be separated by white space`);
      const a = /^([A-Za-z_:][-A-Za-z0-9_:.]*)[ \t\r\n]*=[ \t\r\n]*("([^"<]*)"|'([^'<]*)')/.exec(text.slice(i));
      if (!a) throw new Error(`<${el.name}>: bad attribute at '${text.slice(i, i + 20)}'`);
      if (el.attributes.has(a[1])) throw new Error(`<${el.name}>: attribute ${a[1]} given twice`);
      el.attributes.set(a[1], decode(a[3] ?? a[4], `<${el.name} ${a[1]}>`));
      i += a[0].length;
    }
    if (stack.length > 0 && stack[stack.length - 1] !== el) stack[stack.length - 1].children.push(el);
    else if (stack.length > 1) stack[stack.length - 2].children.push(el);
    if (root === null) root = el;
  }
  if (stack.length > 0) throw new Error(`unclosed element <${stack[stack.length - 1].name}>`);
  if (root === null) throw new Error('no root element');
  return root;
}

/** All elements of a name, depth first. */
export function findAll(el: XmlElement, name: string): XmlElement[] {
  const out: XmlElement[] = [];
  const walk = (e: XmlElement): void => { if (e.name === name) out.push(e); e.children.forEach(walk); };
  walk(el);
  return out;
}
