/** The module ./vite-plugin.ts serves: the Properties editor's type declarations. */
declare module 'virtual:parley/engine-types' {
  const declarations: { filePath: string; content: string }[];
  export default declarations;
}
