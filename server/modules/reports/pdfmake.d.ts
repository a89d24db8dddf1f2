/** The part of pdfmake 0.3's server API the report uses (the package ships no types). */
declare module 'pdfmake' {
  interface OutputDocument {
    getBuffer(): Promise<Buffer>
  }
  interface PdfMake {
    setFonts(fonts: Record<string, Record<'normal' | 'bold' | 'italics' | 'bolditalics', string>>): void
    setUrlAccessPolicy(callback: (url: string) => boolean): void
    setLocalAccessPolicy(callback: (path: string) => boolean): void
    createPdf(doc: Record<string, unknown>, options?: Record<string, unknown>): OutputDocument
  }
  const pdfmake: PdfMake
  export default pdfmake
}
