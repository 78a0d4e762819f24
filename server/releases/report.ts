// The human-readable report of a released set, read from the stored bundle bytes (the report a
// tester unzips is exactly the one the page shows).
import yauzl from 'yauzl';

/** Most entries looked at before giving up (a bundle holds about a dozen; common practice, no source). */
export const MAX_BUNDLE_ENTRIES = 1000;
/** Largest report read, bytes (a report is tens of kilobytes; common practice, no source). */
export const MAX_REPORT_BYTES = 2 * 1024 * 1024;

/**
 * Reads `<root>/REPORT.md` out of a bundle zip.
 * @param zip - the stored bundle bytes.
 * @returns the report text (UTF-8), or null when the bundle has none.
 */
export function reportOfBundle(zip: Buffer): Promise<string | null> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(zip, { lazyEntries: true, strictFileNames: true, validateEntrySizes: true }, (err, file) => {
      if (err || !file) return reject(err ?? new Error('the bundle is not a zip'));
      let seen = 0;
      file.on('error', reject);
      file.on('end', () => resolve(null));
      file.on('entry', (entry: yauzl.Entry) => {
        seen += 1;
        const isReport = /^[^/]+\/REPORT\.md$/.test(entry.fileName);
        if (!isReport) {
          if (seen >= MAX_BUNDLE_ENTRIES) { file.close(); resolve(null); return; }
          file.readEntry();
          return;
        }
        if (entry.uncompressedSize > MAX_REPORT_BYTES) { file.close(); reject(new Error('the report is larger than the reader accepts')); return; }
        file.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e ?? new Error('cannot read the report'));
          const chunks: Buffer[] = [];
          stream.on('data', (c: Buffer) => chunks.push(c));
          stream.on('error', reject);
          stream.on('end', () => { file.close(); resolve(Buffer.concat(chunks).toString('utf8')); });
        });
      });
      file.readEntry();
    });
  });
}
