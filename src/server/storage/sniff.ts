/**
 * What a file really is, judged by its bytes alone: the name and the declared type come from the
 * client and prove nothing.
 */
export type SniffedType = 'image/jpeg' | 'image/png' | 'image/webp' | 'application/pdf' | 'text/csv';

export interface Sniffed {
  /** One of the types we accept, or null for anything else. */
  type: SniffedType | null;
  /** For error messages: "a PDF document", "SVG, HTML or XML markup". */
  description: string;
}

const DESCRIPTIONS: Record<SniffedType, string> = {
  'image/jpeg': 'a JPEG image',
  'image/png': 'a PNG image',
  'image/webp': 'a WebP image',
  'application/pdf': 'a PDF document',
  'text/csv': 'CSV text',
};

function startsWith(bytes: Uint8Array, signature: number[] | string, offset = 0): boolean {
  const sig = typeof signature === 'string' ? [...signature].map((c) => c.charCodeAt(0)) : signature;
  if (bytes.length < offset + sig.length) return false;
  return sig.every((b, i) => bytes[offset + i] === b);
}

function binaryType(bytes: Uint8Array): SniffedType | null {
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  if (startsWith(bytes, 'RIFF') && startsWith(bytes, 'WEBP', 8)) return 'image/webp';
  if (startsWith(bytes, '%PDF-')) return 'application/pdf';
  return null;
}

/** Refused formats worth naming, so that the person uploading knows what went wrong. */
function refusedBinary(bytes: Uint8Array): string | null {
  if (startsWith(bytes, 'GIF87a') || startsWith(bytes, 'GIF89a')) return 'a GIF image';
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) return 'a ZIP archive (such as an Excel or Word file)';
  return null;
}

const utf8 = new TextDecoder('utf-8', { fatal: true });

function decodeText(bytes: Uint8Array): string | Sniffed {
  if (bytes.includes(0)) return { type: null, description: 'a binary file of an unknown type' };
  try {
    return utf8.decode(bytes);
  } catch {
    return { type: null, description: 'text that is not UTF-8 (save it again as UTF-8)' };
  }
}

export function sniff(bytes: Uint8Array): Sniffed {
  const type = binaryType(bytes);
  if (type) return { type, description: DESCRIPTIONS[type] };
  const refused = refusedBinary(bytes);
  if (refused) return { type: null, description: refused };
  const text = decodeText(bytes);
  if (typeof text !== 'string') return text;
  // A browser sniffs text that opens with a tag as HTML or SVG, scripts and all; no CSV opens with one.
  if (/^\uFEFF?\s*</.test(text)) return { type: null, description: 'SVG, HTML or XML markup' };
  return { type: 'text/csv', description: DESCRIPTIONS['text/csv'] };
}
