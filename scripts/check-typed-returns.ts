// House rule checked by a tool: no function a server feature exports returns `any`
// (nor an object, array or promise with `any` inside). Routes answer with what
// these functions return, so an `any` here is an untyped response. Run by
// `npm run typecheck` after tsc; prints each offender and exits 1.
import path from 'node:path';
import ts from 'typescript';

const MAX_DEPTH = 6;
const OPAQUE = new Set(['Date', 'Buffer', 'Uint8Array', 'Uint16Array', 'Float32Array', 'Float64Array', 'RegExp']);
const CONTAINERS = new Set(['Promise', 'Array', 'ReadonlyArray', 'Map', 'Set']);

const configPath = path.resolve('tsconfig.json');
const parsed = ts.parseJsonConfigFileContent(ts.readConfigFile(configPath, ts.sys.readFile).config, ts.sys, path.dirname(configPath));
const program = ts.createProgram(parsed.fileNames, { ...parsed.options, noEmit: true });
const checker = program.getTypeChecker();

/** Where `any` hides in a type ("messages: Array<any>"), or null. */
function anyIn(type: ts.Type, depth = 0, seen = new Set<ts.Type>()): string | null {
  if (depth > MAX_DEPTH || seen.has(type)) return null;
  seen.add(type);
  if (type.flags & ts.TypeFlags.Any) return 'any';
  if (type.isUnionOrIntersection()) {
    for (const part of type.types) {
      const found = anyIn(part, depth + 1, seen);
      if (found) return found;
    }
    return null;
  }
  const name = type.getSymbol()?.getName();
  if (name && OPAQUE.has(name)) return null;
  if (name && CONTAINERS.has(name)) {
    for (const argument of checker.getTypeArguments(type as ts.TypeReference)) {
      const found = anyIn(argument, depth + 1, seen);
      if (found) return `${name}<${found}>`;
    }
    return null;
  }
  if (!(type.flags & ts.TypeFlags.Object)) return null;
  for (const property of type.getProperties()) {
    const declaration = property.valueDeclaration ?? property.declarations?.[0];
    if (!declaration || declaration.getSourceFile().fileName.includes('node_modules')) continue;
    const found = anyIn(checker.getTypeOfSymbolAtLocation(property, declaration), depth + 1, seen);
    if (found) return `${property.getName()}: ${found}`;
  }
  return null;
}

const offenders: string[] = [];
for (const file of program.getSourceFiles()) {
  if (!file.fileName.includes(`${path.sep}server${path.sep}features${path.sep}`)) continue;
  const module = checker.getSymbolAtLocation(file);
  if (!module) continue;
  for (const exported of checker.getExportsOfModule(module)) {
    for (const signature of checker.getTypeOfSymbolAtLocation(exported, file).getCallSignatures()) {
      const found = anyIn(signature.getReturnType());
      if (found) offenders.push(`${path.relative(process.cwd(), file.fileName)}: ${exported.getName()} returns ${found}`);
    }
  }
}
for (const line of offenders) console.error(line);
console.log(
  offenders.length === 0
    ? 'Typed returns: no server feature function returns any.'
    : `Typed returns: ${offenders.length} functions return any (type them, e.g. with the shared response types).`,
);
process.exitCode = offenders.length === 0 ? 0 : 1;
