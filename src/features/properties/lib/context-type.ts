/**
 * Property code destructures an untyped `{ fc, engine }`; the editor can only complete what it can
 * type, so the page annotates the parameter with the global `PropertyContext` (declared for Monaco
 * by engine-types). Sucrase strips the annotation when the code runs, so the vector runs the same.
 */
const untypedDefault = /export\s+default\s+(async\s+)?\(\s*\{\s*fc\s*,\s*engine\s*\}\s*\)/;

export function withContextType(code: string): string {
  return code.replace(untypedDefault, (_match, isAsync: string | undefined) => `export default ${isAsync ?? ''}({ fc, engine }: PropertyContext)`);
}
