// Runs in a worker thread of the password pool (password-hashing.ts): bcrypt is pure JavaScript and
// takes a quarter of a second at cost 12, which on the main thread would stall every other request.
import bcrypt from 'bcryptjs';

export function hash({ password, cost }) {
  return bcrypt.hashSync(password, cost);
}

export function compare({ password, hash }) {
  return bcrypt.compareSync(password, hash);
}
