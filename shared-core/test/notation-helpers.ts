/**
 * The notation's syntax tree in tests, written once: a statement as one line of text (the
 * summaries the parser tests compare), and every node of a statement or a parsed note with its
 * span (for the span checks).
 */
import type { ParsedNote, QuantityNode, Statement } from '../src/notation/ast';
import type { Span } from '../src/text/types';

/** A quantity as written: `24C`, `50%±2`, `?` when missing. */
export function quantityText(v: QuantityNode | null): string {
  if (!v) return '?';
  const tolerance = v.tolerance ? `±${v.tolerance.number.text}${v.tolerance.unit?.text ?? ''}` : '';
  return `${v.number.text}${v.unit?.text ?? ''}${tolerance}`;
}

/**
 * A statement in one line: `state RA: db=24C rh=50%±2`, `mix MA: OA 25% + RA 75% | db=26C`, `?` for
 * a missing part (a new statement kind adds its case here).
 */
export function statementText(st: Statement): string {
  const props = 'props' in st ? st.props.map((p) => `${p.key}=${quantityText(p.value)}`).join(' ') : '';
  const tail = props ? ` | ${props}` : '';
  switch (st.keyword) {
    case 'units':
      return `units: ${st.system?.text ?? '?'}`;
    case 'site':
      return `site: ${props}`;
    case 'state':
      return `state ${st.name?.text ?? '?'}: ${props}`;
    case 'mix': {
      const streams = st.streams.map((s) => `${s.name.text} ${quantityText(s.amount)}`).join(' + ');
      return `mix ${st.name?.text ?? '?'}: ${streams}${tail}`;
    }
    case 'process':
      return (
        `process ${st.name?.text ?? '?'}: ${st.from?.text ?? '?'} ` +
        `-> ${st.to?.text ?? '?'}${st.words.map((w) => ` ${w.text}`).join('')}${tail}`
      );
    case 'supply':
      return `supply ${st.name?.text ?? '?'}: ${st.room?.text ?? '?'}${tail}`;
    case 'recover': {
      const own = (ps: typeof st.props): string =>
        ps.length ? ` | ${ps.map((p) => `${p.key}=${quantityText(p.value)}`).join(' ')}` : '';
      const streams = st.streams.map((x) => `${x.from?.text ?? '?'} -> ${x.to?.text ?? '?'}${own(x.props)}`).join(', ');
      return `recover ${st.name?.text ?? '?'}: ${streams}${st.options.map((o) => ` ${o.key}=${o.word.text}`).join('')}`;
    }
  }
}

/** One node of the tree: a label for messages, its span, and what a span check knows of it. */
export interface TreeNode {
  label: string;
  span: Span;
  /** The text its span must read, when the node keeps it (keywords, keys, names, numbers, units). */
  text?: string;
  /** What its span's text must match otherwise (a tolerance starts with `±` or `+-`). */
  pattern?: RegExp;
  /** The span it must lie inside. */
  parent?: Span;
}

/** Every node of a statement, the statement itself first. */
export function statementNodes(st: Statement, at = 'statement'): TreeNode[] {
  const out: TreeNode[] = [
    { label: at, span: st.span },
    { label: `${at} keyword`, span: st.keywordSpan, text: st.keyword, parent: st.span },
  ];
  const quantity = (label: string, v: QuantityNode | null, parent: Span) => {
    if (!v) return;
    out.push(
      { label: `${label} value`, span: v.span, parent },
      { label: `${label} number`, span: v.number.span, text: v.number.text },
    );
    if (v.unit) out.push({ label: `${label} unit`, span: v.unit.span, text: v.unit.text });
    if (v.tolerance) {
      out.push({ label: `${label} tolerance`, span: v.tolerance.span, pattern: /^(±|\+-)/ });
      out.push({ label: `${label} tolerance number`, span: v.tolerance.number.span, text: v.tolerance.number.text });
      if (v.tolerance.unit)
        out.push({ label: `${label} tolerance unit`, span: v.tolerance.unit.span, text: v.tolerance.unit.text });
    }
  };
  const name = (label: string, n: { text: string; span: Span } | null) => {
    if (n) out.push({ label: `${at} ${label}`, span: n.span, text: n.text });
  };
  if ('name' in st) name('name', st.name);
  if (st.keyword === 'units') name('system', st.system);
  if (st.keyword === 'process') {
    name('from', st.from);
    name('to', st.to);
    st.words.forEach((w, k) => {
      name(`word ${k}`, w);
    });
  }
  if (st.keyword === 'supply') name('room', st.room);
  if (st.keyword === 'recover') {
    st.streams.forEach((x, k) => {
      out.push({ label: `${at} stream ${k}`, span: x.span, parent: st.span });
      name(`stream ${k} from`, x.from);
      name(`stream ${k} to`, x.to);
    });
    st.options.forEach((o, k) => {
      out.push(
        { label: `${at} option ${k}`, span: o.span, parent: st.span },
        { label: `${at} option ${k} key`, span: o.keySpan, text: o.key },
      );
      name(`option ${k} word`, o.word);
    });
  }
  if (st.keyword === 'mix') {
    st.streams.forEach((s, k) => {
      out.push({ label: `${at} stream ${k}`, span: s.span, parent: st.span });
      name(`stream ${k} name`, s.name);
      quantity(`${at} stream ${k}`, s.amount, s.span);
    });
  }
  if ('props' in st) {
    st.props.forEach((p, k) => {
      out.push(
        { label: `${at} prop ${k}`, span: p.span, parent: st.span },
        { label: `${at} prop ${k} key`, span: p.keySpan, text: p.key },
      );
      quantity(`${at} prop ${k}`, p.value, p.span);
    });
  }
  return out;
}

/**
 * Every span of a parsed note, with a label: regions and their
 * lines, headings, diagnostics, and every statement's nodes.
 */
export function noteSpans(p: ParsedNote): [string, Span][] {
  const out: [string, Span][] = [];
  p.regions.forEach((r, i) => {
    out.push([`region ${i}`, r.span], [`region ${i} content`, r.contentSpan]);
    const lines = (r as { lines?: Span[] }).lines ?? [];
    lines.forEach((l, k) => {
      out.push([`region ${i} line ${k}`, l]);
    });
  });
  p.headings.forEach((h, i) => {
    out.push([`heading ${i}`, h.span]);
  });
  p.diagnostics.forEach((d, i) => {
    out.push([`diagnostic ${i} ${d.code}`, d.span]);
  });
  p.statements.forEach((s, i) => {
    for (const n of statementNodes(s, `statement ${i}`)) out.push([n.label, n.span]);
  });
  return out;
}
