// Text values of TEXT and MTEXT entities as plain characters.

const unicodeEscape = (_: string, hex: string): string => String.fromCharCode(Number.parseInt(hex, 16));

const controlCode = (_: string, c: string): string => {
  switch (c.toLowerCase()) {
    case 'c':
      return 'Ø';
    case 'd':
      return '°';
    case 'p':
      return '±';
    case '%':
      return '%';
    case 'u':
    case 'o':
    case 'k':
      return '';
    default:
      return String.fromCharCode(Number(c));
  }
};

/** TEXT control codes (DXF Reference, TEXT: %%c, %%d, %%p, %%nnn) and \U+XXXX to characters. */
export function textValue(raw: string): string {
  if (raw.indexOf('%%') === -1 && raw.indexOf('\\U+') === -1) return raw;
  return raw.replace(/\\U\+([0-9A-Fa-f]{4})/g, unicodeEscape).replace(/%%(\d{3}|[cCdDpPuUoOkK%])/g, controlCode);
}

/** MTEXT with its inline formatting (DXF Reference, MTEXT "Inline codes") removed. */
export function mtextValue(raw: string): string {
  // Escaped backslashes and braces first, so the codes below leave them alone.
  let s = textValue(raw).replace(/\\([\\{}])/g, (_, c: string) => (c === '\\' ? '\u0001' : c === '{' ? '\u0002' : '\u0003'));
  s = s.replace(/\\P/g, '\n').replace(/\\~/g, ' ');
  s = s.replace(/\\S([^;]*?)[\^/#]([^;]*?);/g, '$1/$2');
  s = s.replace(/\\[ACFfHQTWcp][^;\\{}]*;/g, '');
  s = s.replace(/\\[LlOoKkNX]/g, '');
  s = s.replace(/[{}]/g, '');
  return s.replace(/\u0001/g, '\\').replace(/\u0002/g, '{').replace(/\u0003/g, '}');
}
