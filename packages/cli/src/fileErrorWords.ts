/** File and stream error codes (errno names) in plain words, for messages people read. */

const WORDS: Readonly<Record<string, string>> = {
  ENOENT: 'no such file or directory',
  EISDIR: 'it is a directory, not a file',
  ENOTDIR: 'a part of the path is a file, not a directory',
  EACCES: 'permission denied (check the file and directory permissions)',
  EPERM: 'the operation is not permitted',
  ELOOP: 'too many symbolic links on the path (probably a link that points to itself)',
  ENAMETOOLONG: 'the path or one of its names is too long',
  EIO: 'the device reported an input/output error',
  EMFILE: 'too many files are open',
  ENFILE: 'too many files are open on the system',
  ENXIO: 'no such device',
  ENODEV: 'no such device',
  EAGAIN: 'the source is not ready for reading (non-blocking)',
  EBADF: 'the stream is closed',
  ENOSPC: 'no space left on the device',
  EDQUOT: 'the disk quota is used up',
  EFBIG: 'the file is too large for the device',
  EROFS: 'the file system is read-only',
  EPIPE: 'the reader closed the pipe',
  ECONNRESET: 'the connection was reset',
};

/** "no such file or directory" for an ENOENT error; the raw code only for codes not listed. */
export function fileErrorWords(error: unknown): string {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  if (code !== undefined && Object.hasOwn(WORDS, code)) return WORDS[code]!;
  if (code !== undefined) return `system error ${code}`;
  return error instanceof Error ? error.message : String(error);
}
