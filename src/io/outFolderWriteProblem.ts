import type { InputProblem } from '../errors/inputError.js';

/**
 * A file-system failure while making or writing the output folder, as the problem naming --out; null
 * when `code` is no file-system error code (a fault of quantbid's own has none).
 */
export function outFolderWriteProblem(outDir: string, code: string | undefined): InputProblem | null {
  const problem = (message: string, fix: string): InputProblem => ({ file: outDir, field: '--out', message, fix });
  switch (code) {
    case 'EACCES':
    case 'EPERM':
    case 'EROFS':
      return problem('the output folder is not writable', 'choose a folder you may write to');
    case 'ENOTDIR':
    case 'EEXIST':
      return problem('cannot be made: a file stands where a folder should be', 'give a folder for the outputs');
    case 'ENOENT':
      return problem('cannot be made here', 'give a folder on a normal, writable disk');
    case 'ENOSPC':
    case 'EDQUOT':
      return problem('the disk is full', 'free some space or choose another folder');
    case 'ELOOP':
      return problem('runs through a symbolic link that leads back to itself (a loop)', 'give a folder path without that link');
    case 'ENAMETOOLONG':
    case 'EINVAL':
    case 'ERR_INVALID_ARG_VALUE':
      return problem('is not a valid folder name here (too long, or a character the file system refuses)', 'choose a shorter, plain folder name');
    default:
      // Any other error of the file system is still about the folder; a fault of our own has no code.
      return code?.startsWith('E') === true ? problem(`cannot be written (${code})`, 'check the folder and the disk') : null;
  }
}
