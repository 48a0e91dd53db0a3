/**
 * Static scan of src/ for the stable `code` of every error the library
 * constructs (`new InputError(code, ...)`, `new TopologyError(...)`,
 * `new FluxstateError(...)`), with the TypeScript compiler's parser.
 *
 * A code is resolved when the first argument is
 * - a string literal;
 * - a conditional `c ? 'a' : 'b'` of string literals (both are collected);
 * - `e.code` of the error caught by an enclosing `catch (e)` (a re-raise that
 *   adds context keeps the original code; skipped, it adds no code);
 * - a parameter of a local helper (`const fail = (code, message) => new InputError(code, ...)`):
 *   then every call of that helper in the same file must pass a string literal
 *   (or a conditional of literals) as that argument, and those are collected.
 * Anything else is reported as unresolved, so a new dynamic code cannot slip
 * past the catalogue.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import ts from 'typescript';

export const ERROR_CLASSES = ['InputError', 'TopologyError', 'FluxstateError'] as const;
export type ErrorClassName = (typeof ERROR_CLASSES)[number];

/** One place in src/ that raises a code. */
export interface ErrorSite {
  readonly code: string;
  readonly errorClass: ErrorClassName;
  /** `path:line`, relative to the repository root. */
  readonly where: string;
}

export interface ErrorScan {
  readonly sites: readonly ErrorSite[];
  /** Constructor calls whose code could not be resolved statically. */
  readonly unresolved: readonly string[];
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(p);
    return e.name.endsWith('.ts') && !e.name.endsWith('.d.ts') ? [p] : [];
  });
}

/** String literals of an expression that is a literal or a (nested) conditional of literals; undefined otherwise. */
function literals(e: ts.Expression): string[] | undefined {
  if (ts.isStringLiteral(e) || ts.isNoSubstitutionTemplateLiteral(e)) return [e.text];
  if (ts.isParenthesizedExpression(e)) return literals(e.expression);
  if (ts.isConditionalExpression(e)) {
    const a = literals(e.whenTrue);
    const b = literals(e.whenFalse);
    return a && b ? [...a, ...b] : undefined;
  }
  return undefined;
}

/** `e.code` where `e` is the variable of an enclosing `catch (e)`: re-raising a caught error's code adds no new code. */
function isRethrownCode(arg: ts.Expression): boolean {
  if (!ts.isPropertyAccessExpression(arg) || arg.name.text !== 'code' || !ts.isIdentifier(arg.expression)) return false;
  const name = arg.expression.text;
  for (let at: ts.Node | undefined = arg.parent; at; at = at.parent) {
    if (ts.isCatchClause(at)) {
      const v = at.variableDeclaration;
      if (v && ts.isIdentifier(v.name) && v.name.text === name) return true;
    }
  }
  return false;
}

type FunctionLike = ts.FunctionDeclaration | ts.ArrowFunction | ts.FunctionExpression | ts.MethodDeclaration;

/** Name under which a function-like node can be called in its file (declaration name or the const it is bound to). */
function calleeName(f: FunctionLike): string | undefined {
  if ((ts.isFunctionDeclaration(f) || ts.isMethodDeclaration(f)) && f.name && ts.isIdentifier(f.name)) return f.name.text;
  const parent = f.parent;
  if (ts.isVariableDeclaration(parent) && ts.isIdentifier(parent.name)) return parent.name.text;
  return undefined;
}

/** The function whose parameter `name` is in scope at `node`, with the parameter's position. */
function enclosingParameter(node: ts.Node, name: string): { fn: FunctionLike; position: number } | undefined {
  for (let at: ts.Node | undefined = node.parent; at; at = at.parent) {
    if (ts.isFunctionDeclaration(at) || ts.isArrowFunction(at) || ts.isFunctionExpression(at) || ts.isMethodDeclaration(at)) {
      const position = at.parameters.findIndex((p) => ts.isIdentifier(p.name) && p.name.text === name);
      if (position >= 0) return { fn: at, position };
    }
  }
  return undefined;
}

/**
 * Scan every .ts file under `srcDir` (relative paths are reported against `root`).
 *
 * @example
 * ```ts
 * const { sites, unresolved } = scanErrorCodes('src', '.');
 * ```
 */
export function scanErrorCodes(srcDir: string, root: string): ErrorScan {
  const sites: ErrorSite[] = [];
  const unresolved: string[] = [];
  // Calls of every file by callee name, for exported helpers called from other files.
  const allCalls = new Map<string, { call: ts.CallExpression; where: string }[]>();
  for (const file of sourceFiles(srcDir)) {
    const sf = ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.ES2022, true, ts.ScriptKind.TS);
    const visit = (n: ts.Node): void => {
      if (ts.isCallExpression(n) && ts.isIdentifier(n.expression)) {
        const list = allCalls.get(n.expression.text) ?? [];
        list.push({ call: n, where: `${relative(root, file)}:${sf.getLineAndCharacterOfPosition(n.getStart(sf)).line + 1}` });
        allCalls.set(n.expression.text, list);
      }
      ts.forEachChild(n, visit);
    };
    visit(sf);
  }
  for (const file of sourceFiles(srcDir)) {
    const text = readFileSync(file, 'utf8');
    const sf = ts.createSourceFile(file, text, ts.ScriptTarget.ES2022, true, ts.ScriptKind.TS);
    const where = (n: ts.Node): string => `${relative(root, file)}:${sf.getLineAndCharacterOfPosition(n.getStart(sf)).line + 1}`;
    const calls: ts.CallExpression[] = [];
    const news: ts.NewExpression[] = [];
    const visit = (n: ts.Node): void => {
      if (ts.isCallExpression(n)) calls.push(n);
      if (ts.isNewExpression(n) && ts.isIdentifier(n.expression) && (ERROR_CLASSES as readonly string[]).includes(n.expression.text)) news.push(n);
      ts.forEachChild(n, visit);
    };
    visit(sf);
    for (const n of news) {
      const errorClass = (n.expression as ts.Identifier).text as ErrorClassName;
      // The base classes forward their own `code` parameter: those are not raise sites.
      if (file.endsWith(join('src', 'errors.ts'))) continue;
      const arg = n.arguments?.[0];
      if (!arg) {
        unresolved.push(`${where(n)}: new ${errorClass}() without a code`);
        continue;
      }
      if (isRethrownCode(arg)) continue;
      const direct = literals(arg);
      if (direct) {
        for (const code of direct) sites.push({ code, errorClass, where: where(n) });
        continue;
      }
      const param = ts.isIdentifier(arg) ? enclosingParameter(n, arg.text) : undefined;
      const helper = param ? calleeName(param.fn) : undefined;
      if (!param || !helper) {
        unresolved.push(`${where(n)}: new ${errorClass}(${arg.getText(sf)}, ...) is not a literal code`);
        continue;
      }
      // A literal default of the code parameter covers calls that leave it out.
      const init = param.fn.parameters[param.position]?.initializer;
      const defaults = init ? literals(init) : undefined;
      const local = calls.filter((c) => ts.isIdentifier(c.expression) && c.expression.text === helper).map((c) => ({ call: c, where: where(c) }));
      // An exported helper may be called only from other files.
      const uses = local.length > 0 ? local : allCalls.get(helper) ?? [];
      if (uses.length === 0) unresolved.push(`${where(n)}: helper ${helper}() is never called`);
      for (const { call: c, where: at } of uses) {
        const a = c.arguments[param.position];
        const codes = a ? literals(a) : defaults;
        if (!codes) {
          unresolved.push(`${at}: ${helper}(...) passes a code that is not a literal`);
          continue;
        }
        for (const code of codes) sites.push({ code, errorClass, where: at });
      }
    }
  }
  return { sites, unresolved };
}
