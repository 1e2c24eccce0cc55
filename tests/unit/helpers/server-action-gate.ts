/**
 * The server-action gate checker, on the TypeScript syntax tree (not a regex): in a module marked "use server",
 * every export is a server action and must go through the gate. An export passes when it is an `action(…)` wrapper
 * from lib/auth/action.ts itself, or a function whose first statement calls such a wrapper (the wrapper resolves
 * the actor and checks the permission before anything else). A function anywhere with its own "use server"
 * directive is held to the same rule. Re-exports from another module and exported values that are not functions
 * are refused: the checker cannot see them go through the gate.
 */
import ts from "typescript";

export interface ServerActionExport {
  /** the exported name ("default" for the default export) */
  name: string;
  gated: boolean;
  /** why it fails, when it does */
  reason?: string;
}

export interface ServerActionReport {
  /** the module starts with the "use server" directive */
  moduleDirective: boolean;
  /** the local name the `action` wrapper factory is imported under, if it is imported */
  actionImport?: string;
  /** local names bound to `action(…)` at the top level */
  wrappers: string[];
  /** every export of a "use server" module, plus every function with its own "use server" directive */
  exports: ServerActionExport[];
}

const ACTION_MODULE = "@/lib/auth/action";

function hasUseServer(statements: readonly ts.Statement[]): boolean {
  for (const s of statements) {
    if (!ts.isExpressionStatement(s) || !ts.isStringLiteral(s.expression)) return false; // the directive prologue ends
    if (s.expression.text === "use server") return true;
  }
  return false;
}

function hasModifier(node: ts.Node, kind: ts.SyntaxKind): boolean {
  return ts.canHaveModifiers(node) && (ts.getModifiers(node) ?? []).some((m) => m.kind === kind);
}

type FunctionLike = ts.FunctionDeclaration | ts.FunctionExpression | ts.ArrowFunction;

function isFunctionLike(node: ts.Node): node is FunctionLike {
  return ts.isFunctionDeclaration(node) || ts.isFunctionExpression(node) || ts.isArrowFunction(node);
}

function unwrap(e: ts.Expression): ts.Expression {
  let x = e;
  while (ts.isParenthesizedExpression(x) || ts.isAsExpression(x) || ts.isSatisfiesExpression(x) || ts.isNonNullExpression(x) || ts.isAwaitExpression(x)) {
    x = x.expression;
  }
  return x;
}

/** Check one module's source text. */
export function checkServerActionSource(source: string, fileName = "module.ts"): ServerActionReport {
  const sf = ts.createSourceFile(fileName, source, ts.ScriptTarget.Latest, true, fileName.endsWith(".tsx") ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const moduleDirective = hasUseServer(sf.statements);

  // import { action } from "@/lib/auth/action" (possibly renamed)
  let actionImport: string | undefined;
  for (const s of sf.statements) {
    if (!ts.isImportDeclaration(s) || !ts.isStringLiteral(s.moduleSpecifier) || s.moduleSpecifier.text !== ACTION_MODULE) continue;
    const named = s.importClause?.namedBindings;
    if (s.importClause?.isTypeOnly || !named || !ts.isNamedImports(named)) continue;
    for (const el of named.elements) {
      if (!el.isTypeOnly && (el.propertyName ?? el.name).text === "action") actionImport = el.name.text;
    }
  }

  const isActionCall = (e: ts.Expression | undefined): boolean => {
    if (!e || !actionImport) return false;
    const x = unwrap(e);
    return ts.isCallExpression(x) && ts.isIdentifier(x.expression) && x.expression.text === actionImport;
  };

  // top-level declarations by name, and the wrappers among them
  const locals = new Map<string, ts.Node>();
  const wrappers: string[] = [];
  for (const s of sf.statements) {
    if (ts.isFunctionDeclaration(s) && s.name) locals.set(s.name.text, s);
    if (ts.isVariableStatement(s)) {
      for (const d of s.declarationList.declarations) {
        if (!ts.isIdentifier(d.name)) continue;
        locals.set(d.name.text, d);
        // only a const binding stays the wrapper: a let could be reassigned after the check
        if ((s.declarationList.flags & ts.NodeFlags.Const) !== 0 && isActionCall(d.initializer)) wrappers.push(d.name.text);
      }
    }
  }

  /** The first statement of the body calls a wrapper: `await w(…)`, `return w(…)`, `const r = await w(…)`. */
  const callsWrapperFirst = (fn: FunctionLike): string | undefined => {
    if (!fn.body) return "has no body";
    if (!ts.isBlock(fn.body)) {
      const x = unwrap(fn.body);
      return ts.isCallExpression(x) && ts.isIdentifier(x.expression) && wrappers.includes(x.expression.text)
        ? undefined
        : "does not call an action() wrapper first";
    }
    const first = fn.body.statements.find((st) => !(ts.isExpressionStatement(st) && ts.isStringLiteral(st.expression)));
    let called: ts.Expression | undefined;
    if (first && ts.isExpressionStatement(first)) called = first.expression;
    else if (first && ts.isReturnStatement(first)) called = first.expression;
    else if (first && ts.isVariableStatement(first) && first.declarationList.declarations.length === 1) {
      called = first.declarationList.declarations[0].initializer;
    }
    const x = called && unwrap(called);
    if (x && ts.isCallExpression(x) && ts.isIdentifier(x.expression) && wrappers.includes(x.expression.text)) return undefined;
    return "does not call an action() wrapper first";
  };

  /** Why a value exported from this module is not gated (undefined when it is). */
  const ungated = (value: ts.Node | undefined, seen = new Set<string>()): string | undefined => {
    if (!value) return "is not declared in this module";
    if (ts.isVariableDeclaration(value)) {
      const list = value.parent;
      if (ts.isVariableDeclarationList(list) && (list.flags & ts.NodeFlags.Const) === 0) return "is a let or var binding (could be reassigned)";
      return ungated(value.initializer, seen);
    }
    if (isFunctionLike(value)) return callsWrapperFirst(value);
    if (ts.isExpression(value)) {
      if (isActionCall(value)) return undefined;
      const x = unwrap(value);
      if (isFunctionLike(x)) return callsWrapperFirst(x);
      if (ts.isIdentifier(x)) {
        if (seen.has(x.text)) return "refers to itself";
        seen.add(x.text);
        if (!locals.has(x.text)) return "is imported or undeclared, not gated in this module";
        return ungated(locals.get(x.text), seen);
      }
      return "is not a function that goes through action()";
    }
    return "is not a function that goes through action()";
  };

  const exports: ServerActionExport[] = [];
  const add = (name: string, reason: string | undefined) => exports.push({ name, gated: reason === undefined, ...(reason ? { reason } : {}) });

  if (moduleDirective) {
    for (const s of sf.statements) {
      if (ts.isFunctionDeclaration(s) && hasModifier(s, ts.SyntaxKind.ExportKeyword)) {
        add(hasModifier(s, ts.SyntaxKind.DefaultKeyword) ? "default" : (s.name?.text ?? "default"), callsWrapperFirst(s));
      } else if (ts.isVariableStatement(s) && hasModifier(s, ts.SyntaxKind.ExportKeyword)) {
        for (const d of s.declarationList.declarations) {
          if (!ts.isIdentifier(d.name)) add(d.name.getText(sf), "is a destructured export, not a function that goes through action()");
          else add(d.name.text, ungated(d));
        }
      } else if (ts.isExportAssignment(s)) {
        add("default", ungated(s.expression));
      } else if (ts.isExportDeclaration(s)) {
        if (s.isTypeOnly) continue;
        if (s.moduleSpecifier) {
          const from = ts.isStringLiteral(s.moduleSpecifier) ? s.moduleSpecifier.text : "another module";
          const names = s.exportClause && ts.isNamedExports(s.exportClause) ? s.exportClause.elements.map((e) => e.name.text) : ["*"];
          for (const n of names) add(n, `is re-exported from ${from}: declare the action here, wrapped by action()`);
          continue;
        }
        if (s.exportClause && ts.isNamedExports(s.exportClause)) {
          for (const el of s.exportClause.elements) {
            if (el.isTypeOnly) continue;
            const local = (el.propertyName ?? el.name).text;
            add(el.name.text, locals.has(local) ? ungated(locals.get(local), new Set([local])) : "is imported or undeclared, not gated in this module");
          }
        }
      } else if ((ts.isClassDeclaration(s) || ts.isEnumDeclaration(s)) && hasModifier(s, ts.SyntaxKind.ExportKeyword)) {
        add(s.name?.text ?? "default", "is not a function that goes through action()");
      }
    }
  }

  // functions with their own "use server" directive (inline server actions), in any module
  const visit = (node: ts.Node): void => {
    if (isFunctionLike(node) && node.body && ts.isBlock(node.body) && hasUseServer(node.body.statements)) {
      const name = node.name && ts.isIdentifier(node.name)
        ? node.name.text
        : ts.isVariableDeclaration(node.parent) && ts.isIdentifier(node.parent.name) ? node.parent.name.text : "(inline)";
      add(`${name} (inline "use server")`, callsWrapperFirst(node));
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);

  return { moduleDirective, actionImport, wrappers, exports };
}
