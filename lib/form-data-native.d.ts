/**
 * React Native's FormData takes a file by its URI ({ uri, name, type }) where the web's takes a
 * Blob; the DOM typings know only the web's. This is the overload React Native has.
 */
interface FormData {
  append(name: string, value: { uri: string; name: string; type: string }): void;
}
