/**
 * A short list of passwords that are too common to accept (shipped with the app, compared lower-cased).
 * Common practice, no single source: these are the perennial entries of public breach-frequency lists.
 */
export const COMMON_PASSWORDS = new Set([
  "123456789012", "password1234", "passwordpassword", "qwertyuiop12", "qwertyuiopas", "iloveyou1234",
  "111111111111", "000000000000", "123123123123", "abc123abc123", "letmein12345", "welcome12345",
  "administrator", "changeme1234", "football1234", "baseball1234", "monkey123456", "dragon123456",
  "sunshine1234", "princess1234", "trustno12345", "superman1234", "1q2w3e4r5t6y", "zaq12wsxcde3",
  "password123!", "passw0rd1234", "p@ssword1234", "p@ssw0rd1234", "qwerty123456", "asdfghjkl123",
  "123456789abc", "abcdefghijkl", "compliance123", "ballast12345",
]);

/** Whether a password is on the shipped list of common passwords. */
export function isCommonPassword(password: string): boolean {
  return COMMON_PASSWORDS.has(password.toLowerCase());
}
