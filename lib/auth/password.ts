/** Password hashing (bcrypt, cost 11, salted per password) and the checks new passwords must pass. */
import bcrypt from "bcryptjs";
import { randomUUID } from "node:crypto";

const COST = 11;

/** Hash a password with a per-password salt. */
export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

/** Compare a password with a stored hash. */
export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}

let dummy: Promise<string> | undefined;
/** A hash of a random string, compared against when an account does not exist so timing does not reveal it. */
export function dummyHash(): Promise<string> {
  dummy ??= bcrypt.hash(randomUUID(), COST);
  return dummy;
}
