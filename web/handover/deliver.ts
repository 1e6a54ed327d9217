/**
 * Getting files off the phone: the share sheet (Web Share API Level 2, `navigator.share({ files })`)
 * where the browser can share these files, otherwise a download through an object URL.
 *
 * Completion: a share resolves only when the user picked a target (it rejects with AbortError when the
 * sheet is dismissed → 'cancelled'); a download is handed to the browser and counts as done once the
 * download was started. Only a completed delivery may reset the "not yet exported" counter.
 */

export interface OutFile {
  name: string;
  type: string;
  text: string;
}

export type Delivery = 'shared' | 'downloaded' | 'cancelled';

function toFile(f: OutFile): File {
  return new File([f.text], f.name, { type: f.type });
}

/** True when this browser can put these files on the share sheet. */
export function canShareFiles(files: readonly OutFile[]): boolean {
  if (typeof navigator === 'undefined' || typeof navigator.share !== 'function' || !navigator.canShare)
    return false;
  try {
    return navigator.canShare({ files: files.map(toFile) });
  } catch {
    return false;
  }
}

function download(f: OutFile): void {
  const url = URL.createObjectURL(new Blob([f.text], { type: f.type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = f.name;
  a.rel = 'noopener';
  a.style.display = 'none';
  document.body.append(a);
  a.click();
  a.remove();
  // Give the browser time to start reading the blob before it is released.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

/** Shares the files (one sheet for all) or downloads each; says how it ended. */
export async function deliver(
  files: readonly OutFile[],
  title: string,
  preferShare = true,
): Promise<Delivery> {
  if (preferShare && canShareFiles(files)) {
    try {
      await navigator.share({ files: files.map(toFile), title });
      return 'shared';
    } catch (err) {
      if ((err as { name?: string }).name === 'AbortError') return 'cancelled';
      // NotAllowedError (no user gesture left) or a share target failure: fall back to downloads.
    }
  }
  for (const f of files) download(f);
  return 'downloaded';
}
