/**
 * React Native's FormData takes a file by its URI where the web's takes a Blob; the DOM typings
 * know only the web's. This declares the overload React Native has (imported for its type by the
 * native upload, so both type checks — the app's and the server's, which checks the unit tests —
 * see it).
 */
export interface NativeFile {
  uri: string;
  name: string;
  type: string;
}

declare global {
  interface FormData {
    append(name: string, value: NativeFile): void;
  }
}
