// fontkit (a dependency of pdfmake's PDF engine) ships no types; the font test needs one call.
declare module 'fontkit' {
  const fontkit: { openSync(path: string): unknown };
  export default fontkit;
}
