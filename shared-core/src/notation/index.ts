/** The notation's syntax tree and its tolerant parser (never throws; knows no physics or units). */
export { parseNote } from './parse';
export type {
  AirRegion,
  CoreDiagnostic,
  HeadingNode,
  Keyword,
  MixStatement,
  MixStream,
  NameNode,
  NumberNode,
  ParsedNote,
  ProcessStatement,
  PropertyNode,
  QuantityNode,
  SiteStatement,
  StateStatement,
  Statement,
  StatementOrigin,
  ToleranceNode,
  UnitNode,
  UnitsStatement,
} from './ast';
