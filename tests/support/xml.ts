// A small, strict XML reader for tests that check documents the product writes (JUnit reports):
// elements, attributes and text, entities decoded; throws on anything not well formed.

export interface XmlElement {
  name: string;
  attributes: Record<string, string>;
  children: XmlElement[];
  text: string;
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

function decode(text: string, at: number): string {
  return text.replace(/&([a-z]+|#\d+|#x[0-9a-f]+);|&/gi, (m, name: string | undefined) => {
    if (name === undefined) throw new Error(`bare & at ${at}`);
    if (name.startsWith('#x') || name.startsWith('#X')) return String.fromCodePoint(parseInt(name.slice(2), 16));
    if (name.startsWith('#')) return String.fromCodePoint(parseInt(name.slice(1), 10));
    if (!(name in ENTITIES)) throw new Error(`unknown entity ${m} at ${at}`);
    return ENTITIES[name];
  });
}

const NAME = '[A-Za-z_][\\w.:-]*';
const ATTRIBUTE = new RegExp(`\\s+(${NAME})\\s*=\\s*("([^"<]*)"|'([^'<]*)')`, 'y');

/** The document's root element. */
export function parseXml(xml: string): XmlElement {
  let i = 0;
  const skipProlog = () => {
    for (;;) {
      const ws = /^\s*/.exec(xml.slice(i))![0].length;
      i += ws;
      if (xml.startsWith('<?', i)) i = xml.indexOf('?>', i) + 2;
      else if (xml.startsWith('<!--', i)) i = xml.indexOf('-->', i) + 3;
      else return;
      if (i < 2) throw new Error('unterminated declaration or comment');
    }
  };
  const element = (): XmlElement => {
    const open = new RegExp(`<(${NAME})`, 'y');
    open.lastIndex = i;
    const m = open.exec(xml);
    if (!m) throw new Error(`expected an element at ${i}: ${xml.slice(i, i + 20)}`);
    const el: XmlElement = { name: m[1], attributes: {}, children: [], text: '' };
    i = open.lastIndex;
    for (;;) {
      ATTRIBUTE.lastIndex = i;
      const a = ATTRIBUTE.exec(xml);
      if (!a) break;
      if (a[1] in el.attributes) throw new Error(`attribute ${a[1]} twice on <${el.name}>`);
      el.attributes[a[1]] = decode(a[3] ?? a[4], i);
      i = ATTRIBUTE.lastIndex;
    }
    const end = /\s*(\/?)>/y;
    end.lastIndex = i;
    const e = end.exec(xml);
    if (!e) throw new Error(`malformed start tag <${el.name}> at ${i}`);
    i = end.lastIndex;
    if (e[1] === '/') return el;
    for (;;) {
      const lt = xml.indexOf('<', i);
      if (lt < 0) throw new Error(`<${el.name}> is not closed`);
      el.text += decode(xml.slice(i, lt), i);
      i = lt;
      if (xml.startsWith('</', i)) {
        const close = new RegExp(`</(${NAME})\\s*>`, 'y');
        close.lastIndex = i;
        const c = close.exec(xml);
        if (!c || c[1] !== el.name) throw new Error(`<${el.name}> closed by ${xml.slice(i, i + 20)}`);
        i = close.lastIndex;
        return el;
      }
      if (xml.startsWith('<!--', i)) {
        i = xml.indexOf('-->', i) + 3;
        continue;
      }
      el.children.push(element());
    }
  };
  skipProlog();
  const root = element();
  skipProlog();
  if (i !== xml.length) throw new Error(`content after the root element at ${i}`);
  return root;
}

/** Child elements named `name`. */
export const childrenNamed = (el: XmlElement, name: string) => el.children.filter((c) => c.name === name);
