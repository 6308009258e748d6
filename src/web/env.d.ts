/** Vite's `?raw` imports: the file's text (the bundled example machines). */
declare module '*?raw' {
  const text: string;
  export default text;
}
