/** The one text node that holds a label's visible characters, when there is exactly one. */
import type { XmlDocument, XmlElement, XmlText } from '../../read/xml-tree.js';
import { textNodesOf } from '../edit-list.js';

export function soleTextNode(doc: XmlDocument, el: XmlElement): XmlText | null {
  const nodes = textNodesOf(el).filter((n) => n.value.trim() !== '');
  if (nodes.length !== 1) return null;
  const n = nodes[0]!;
  if (n.cdata) return null;
  // Offsets inside the node are only safe when the source holds the characters as they are.
  if (doc.source.slice(n.span.start, n.span.end) !== n.value) return null;
  return n;
}
