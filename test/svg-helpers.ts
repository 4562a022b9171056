/**
 * Test helpers for the SVG and HTML tests: a small, strict XML well-formedness checker (no DOM
 * library) that returns the element tree, and queries over it.
 */

export interface XmlElement {
  name: string;
  attrs: Record<string, string>;
  children: XmlElement[];
  text: string;
}

const NAME = /^[A-Za-z_:][-A-Za-z0-9_:.]*/;
const ENTITY = /^&(amp|lt|gt|quot|apos|#[0-9]+|#x[0-9a-fA-F]+);/;

function decode(s: string): string {
  return s.replace(/&(amp|lt|gt|quot|apos|#[0-9]+|#x[0-9a-fA-F]+);/g, (_, e: string) =>
    e === 'amp' ? '&' : e === 'lt' ? '<' : e === 'gt' ? '>' : e === 'quot' ? '"' : e === 'apos' ? "'" : String.fromCodePoint(e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10)),
  );
}

function checkText(s: string, at: number): void {
  for (let i = 0; i < s.length; i++) {
    if (s[i] === '<') throw new Error(`raw "<" in text at ${at + i}`);
    if (s[i] === '&' && !ENTITY.test(s.slice(i))) throw new Error(`bare "&" at ${at + i}`);
  }
}

/**
 * Parses an XML fragment with exactly one root element (after optional whitespace, an XML
 * declaration or a doctype for HTML is NOT accepted here). Throws on any well-formedness error:
 * unbalanced or mismatched tags, bad attribute syntax, duplicate attributes, bare & or <.
 * `voidElements` lists names that may appear without a closing tag (for HTML).
 */
export function parseXml(src: string, voidElements: readonly string[] = []): XmlElement {
  const root: XmlElement = { name: '#document', attrs: {}, children: [], text: '' };
  const stack: XmlElement[] = [root];
  let i = 0;
  while (i < src.length) {
    const lt = src.indexOf('<', i);
    const text = lt < 0 ? src.slice(i) : src.slice(i, lt);
    checkText(text, i);
    stack[stack.length - 1].text += decode(text);
    if (lt < 0) break;
    i = lt;
    if (src.startsWith('<!--', i)) {
      const end = src.indexOf('-->', i + 4);
      if (end < 0) throw new Error(`unterminated comment at ${i}`);
      i = end + 3;
      continue;
    }
    if (src.startsWith('<!DOCTYPE', i) || src.startsWith('<!doctype', i)) {
      if (stack.length !== 1 || root.children.length) throw new Error('doctype not at the start');
      const end = src.indexOf('>', i);
      i = end + 1;
      continue;
    }
    if (src[i + 1] === '/') {
      const m = NAME.exec(src.slice(i + 2));
      if (!m) throw new Error(`bad closing tag at ${i}`);
      const name = m[0];
      let j = i + 2 + name.length;
      while (/\s/.test(src[j])) j++;
      if (src[j] !== '>') throw new Error(`bad closing tag </${name} at ${i}`);
      const top = stack.pop()!;
      if (top.name !== name) throw new Error(`</${name}> closes <${top.name}> at ${i}`);
      i = j + 1;
      continue;
    }
    const m = NAME.exec(src.slice(i + 1));
    if (!m) throw new Error(`bad tag at ${i}: ${src.slice(i, i + 20)}`);
    const el: XmlElement = { name: m[0], attrs: {}, children: [], text: '' };
    let j = i + 1 + m[0].length;
    for (;;) {
      const ws = j;
      while (/\s/.test(src[j])) j++;
      if (src.startsWith('/>', j)) {
        j += 2;
        stack[stack.length - 1].children.push(el);
        break;
      }
      if (src[j] === '>') {
        j += 1;
        stack[stack.length - 1].children.push(el);
        if (!voidElements.includes(el.name)) stack.push(el);
        if (el.name === 'style' || el.name === 'script') {
          const close = src.indexOf(`</${el.name}>`, j);
          if (close < 0) throw new Error(`unclosed <${el.name}>`);
          el.text = src.slice(j, close);
          j = close;
        }
        break;
      }
      if (j === ws) throw new Error(`missing whitespace before attribute in <${el.name}> at ${j}`);
      const a = NAME.exec(src.slice(j));
      if (!a) throw new Error(`bad attribute in <${el.name}> at ${j}: ${src.slice(j, j + 20)}`);
      j += a[0].length;
      if (src[j] !== '=') throw new Error(`attribute ${a[0]} of <${el.name}> has no value`);
      const q = src[j + 1];
      if (q !== '"' && q !== "'") throw new Error(`attribute ${a[0]} of <${el.name}> is not quoted`);
      const end = src.indexOf(q, j + 2);
      if (end < 0) throw new Error(`unterminated attribute ${a[0]}`);
      const raw = src.slice(j + 2, end);
      checkText(raw, j + 2);
      if (a[0] in el.attrs) throw new Error(`duplicate attribute ${a[0]} in <${el.name}>`);
      el.attrs[a[0]] = decode(raw);
      j = end + 1;
    }
    i = j;
  }
  if (stack.length !== 1) throw new Error(`unclosed <${stack[stack.length - 1].name}>`);
  const elements = root.children;
  if (elements.length !== 1) throw new Error(`expected one root element, found ${elements.length}`);
  if (root.text.trim() !== '') throw new Error('text outside the root element');
  return elements[0];
}

/** Every descendant element (depth first) matching the predicate. */
export function findAll(el: XmlElement, pred: (e: XmlElement) => boolean): XmlElement[] {
  const out: XmlElement[] = [];
  const walk = (e: XmlElement) => {
    for (const c of e.children) {
      if (pred(c)) out.push(c);
      walk(c);
    }
  };
  walk(el);
  return out;
}

/** All text inside an element. */
export function textOf(el: XmlElement): string {
  return el.text + el.children.map(textOf).join('');
}
