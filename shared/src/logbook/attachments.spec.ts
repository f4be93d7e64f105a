import { describe, expect, it } from 'vitest';
import { safeAttachmentName, sniffMediaType } from './attachments.js';

const bytes = (...b: number[]) => Uint8Array.from(b);

describe('attachment type from the bytes', () => {
  it('recognises JPEG, PNG and PDF by their signatures', () => {
    expect(sniffMediaType(bytes(0xff, 0xd8, 0xff, 0xe0, 0, 0x10))).toBe('image/jpeg');
    expect(sniffMediaType(bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0))).toBe(
      'image/png',
    );
    expect(sniffMediaType(new TextEncoder().encode('%PDF-1.7\n'))).toBe('application/pdf');
  });
  it('refuses anything else, whatever its name says', () => {
    expect(sniffMediaType(new TextEncoder().encode('<html>'))).toBeNull();
    expect(sniffMediaType(bytes(0x4d, 0x5a, 0x90))).toBeNull(); // a Windows executable
    expect(sniffMediaType(bytes(0x89, 0x50, 0x4e))).toBeNull(); // cut short
    expect(sniffMediaType(bytes())).toBeNull();
  });
});

describe('safe attachment names', () => {
  it.each([
    ['../../etc/passwd', 'passwd'],
    ['C:\\Windows\\system32\\x.pdf', 'x.pdf'],
    ['..\\..\\boot.ini', 'boot.ini'],
    ['.hidden', 'hidden'],
    ['spillway <script>.jpg', 'spillway _script_.jpg'],
    ['line\nbreak.png', 'line_break.png'],
    ['', 'attachment'],
    ['/', 'attachment'],
    ['Gate 2 — inspection (left).pdf', 'Gate 2 _ inspection (left).pdf'],
  ])('%j becomes %j', (raw, safe) => {
    expect(safeAttachmentName(raw)).toBe(safe);
  });
  it('keeps names short', () => {
    expect(safeAttachmentName('a'.repeat(500) + '.pdf')).toHaveLength(120);
  });
});
