/**
 * The nodes the parser builds for the common statement (`state NAME: key=value …`) and its
 * properties: the shapes of `ast.ts`, with the spans that follow from a node's other fields made on
 * read instead of stored. A number's and a unit's text are exactly what is written, so their span is
 * their first offset and their length; a property's key span starts the property; a quantity runs
 * from its number to its last part; a statement's keyword starts the statement. A note of many
 * states keeps about half the objects it would with a stored span for each (the tree stays in
 * memory while a note is open, and until the command line's output is written).
 *
 * A span read from one of these is a new object each time (nothing keeps it, and nothing can move
 * the node through it). `toJSON` writes each node as the interfaces describe it, fields in their
 * order, so the tree's JSON is what it was with stored spans. Every builder of these nodes (the
 * parser, and the incremental parser's moved copies) builds them with these classes, so two trees
 * of the same text compare equal.
 *
 * The fields are declared without being defined (`declare`): a class field that is defined is
 * set once to undefined before the constructor sets it (by a function of its own that every
 * construction calls), which is work for nothing on the nodes of every line. Each constructor
 * sets the fields in the order they are declared, so a node's own keys keep that order.
 */
import type { Span } from '../text/types';
import type {
  NameNode,
  NumberNode,
  PropertyNode,
  PropertyRefNode,
  QuantityNode,
  StateStatement,
  StatementOrigin,
  ToleranceNode,
  UnitNode,
} from './ast';

/** A copy of a span (the JSON of a node never shares an object with another node's). */
function copy(s: Span): Span {
  return { start: s.start, end: s.end };
}

/** A number as written: its span is `[at, at + text.length)`. */
export class ParsedNumber implements NumberNode {
  declare value: number;
  declare text: string;
  declare resolution: number;
  /** Offset of the number's first character. */
  declare at: number;

  constructor(value: number, text: string, resolution: number, at: number) {
    this.value = value;
    this.text = text;
    this.resolution = resolution;
    this.at = at;
  }

  get span(): Span {
    return { start: this.at, end: this.at + this.text.length };
  }

  /** End of the number (its span's end, without making the span). */
  get end(): number {
    return this.at + this.text.length;
  }

  toJSON(): NumberNode {
    return { value: this.value, text: this.text, resolution: this.resolution, span: this.span };
  }
}

/** A unit symbol as written: its span is `[at, at + text.length)`. */
export class ParsedUnit implements UnitNode {
  declare text: string;
  /** Offset of the unit's first character. */
  declare at: number;

  constructor(text: string, at: number) {
    this.text = text;
    this.at = at;
  }

  get span(): Span {
    return { start: this.at, end: this.at + this.text.length };
  }

  /** End of the unit (its span's end, without making the span). */
  get end(): number {
    return this.at + this.text.length;
  }

  toJSON(): UnitNode {
    return { text: this.text, span: this.span };
  }
}

/** A value with its unit and tolerance: its span runs from its number to its last part. */
export class ParsedQuantity implements QuantityNode {
  declare number: ParsedNumber;
  declare unit: ParsedUnit | null;
  declare tolerance: ToleranceNode | null;

  constructor(number: ParsedNumber, unit: ParsedUnit | null, tolerance: ToleranceNode | null) {
    this.number = number;
    this.unit = unit;
    this.tolerance = tolerance;
  }

  get span(): Span {
    return { start: this.number.at, end: this.end };
  }

  /** End of the quantity's last part (its span's end, without making the span). */
  get end(): number {
    return this.tolerance ? this.tolerance.span.end : this.unit ? this.unit.end : this.number.end;
  }

  toJSON(): QuantityNode {
    return { number: this.number, unit: this.unit, tolerance: this.tolerance, span: this.span };
  }
}

/** `key=value`: the key is written at `at`, so its span is `[at, at + key.length)`. */
export class ParsedProperty implements PropertyNode {
  declare key: string;
  declare value: QuantityNode | null;
  /** Offset of the key (the property's start). */
  declare at: number;
  /** End of the property. */
  declare end: number;
  /** Present only for a reference (set after construction, as an optional field of the interface). */
  declare ref?: PropertyRefNode;

  constructor(key: string, value: QuantityNode | null, at: number, end: number) {
    this.key = key;
    this.value = value;
    this.at = at;
    this.end = end;
  }

  get keySpan(): Span {
    return { start: this.at, end: this.at + this.key.length };
  }

  get span(): Span {
    return { start: this.at, end: this.end };
  }

  toJSON(): PropertyNode {
    const out: PropertyNode = { key: this.key, keySpan: this.keySpan, value: this.value, span: this.span };
    if (this.ref) out.ref = this.ref;
    return out;
  }
}

/**
 * `state NAME: key=value …`: the keyword starts the statement, so its span is
 * `[span.start, span.start + 5)`. The statement's span is stored (the evaluator reads it for every
 * statement); a fence line holding exactly the statement lends it its own span object.
 */
export class ParsedState implements StateStatement {
  declare readonly keyword: 'state';
  declare origin: StatementOrigin;
  declare span: Span;
  declare name: NameNode | null;
  declare props: PropertyNode[];

  constructor(origin: StatementOrigin, span: Span, name: NameNode | null, props: PropertyNode[]) {
    this.keyword = 'state';
    this.origin = origin;
    this.span = span;
    this.name = name;
    this.props = props;
  }

  get keywordSpan(): Span {
    return { start: this.span.start, end: this.span.start + this.keyword.length };
  }

  toJSON(): StateStatement {
    return {
      keyword: this.keyword,
      keywordSpan: this.keywordSpan,
      origin: this.origin,
      span: copy(this.span),
      name: this.name,
      props: this.props,
    };
  }
}
