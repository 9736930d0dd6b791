import type { CommandContext, FileSource } from '../../src/methods/methodModule';

/** A command context over files held in memory (a missing name fails as the file system does, ENOENT). */
export function memoryCommandContext(files: Record<string, string>): CommandContext {
  return {
    open(path: string): FileSource {
      const text = files[path];
      const missing = () => Object.assign(new Error('no such file'), { code: 'ENOENT' });
      return {
        name: path,
        size: text === undefined ? null : text.length,
        text: async () => {
          if (text === undefined) throw missing();
          return text;
        },
        bytes: () => {
          if (text === undefined) throw missing();
          return (async function* () {
            yield new TextEncoder().encode(text);
          })();
        },
      };
    },
  };
}
