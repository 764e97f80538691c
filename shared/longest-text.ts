/**
 * The longest text JavaScript can hold as one string: V8's limit on 64-bit systems (Node's
 * `buffer.constants.MAX_STRING_LENGTH`, the same in Electron), about 512 Mi characters.
 * A file's readers gather each value (a JSON record, a CSV field) into one string, so one
 * longer than this cannot be read at all; they refuse it by this number, with its place in
 * the file, before JavaScript fails with a bare "Invalid string length".
 */
export const LONGEST_TEXT = 2 ** 29 - 24;
