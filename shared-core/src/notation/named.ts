/** Which statements define a name (a state, mix, process, supply or heat recovery line). */
import type {
  MixStatement,
  ProcessStatement,
  RecoverStatement,
  StateStatement,
  Statement,
  SupplyStatement,
} from './ast';

/** A statement that may give a name (its `name` is null when none is written). */
export type NamingStatement = StateStatement | MixStatement | ProcessStatement | SupplyStatement | RecoverStatement;

/** True for the statements that may define a name: every keyword but `site` and `units`. */
export function namesSomething(s: Statement): s is NamingStatement {
  return (
    s.keyword === 'state' ||
    s.keyword === 'mix' ||
    s.keyword === 'process' ||
    s.keyword === 'supply' ||
    s.keyword === 'recover'
  );
}
