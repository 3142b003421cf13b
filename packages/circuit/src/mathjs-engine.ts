/**
 * The expression engine of netlists: mathjs, with the functions that change mathjs itself disabled (expressions come
 * from netlists users upload; mathjs documentation, "Security"). Importing this module registers it
 * (expressions.ts); index.ts does, the command line only when a netlist needs it.
 */
import { all, create } from 'mathjs';
import { setExpressionEngine } from './expressions';
import { rewriteSuffixedNumbers } from './values';

const math = create(all as NonNullable<typeof all>, {});
const parseExpr = math.parse;
math.import(
  {
    import: () => {
      throw new Error('import is disabled');
    },
    createUnit: () => {
      throw new Error('createUnit is disabled');
    },
    evaluate: () => {
      throw new Error('evaluate is disabled');
    },
    parse: () => {
      throw new Error('parse is disabled');
    },
  },
  { override: true },
);

setExpressionEngine({
  compile(expr) {
    const code = parseExpr(rewriteSuffixedNumbers(expr.toLowerCase())).compile();
    return (scope) => code.evaluate(scope);
  },
});
