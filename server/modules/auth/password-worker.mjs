// Pool threads for password hashing start here. Plain JavaScript: bcryptjs is CPU work that would
// otherwise stall every request on the main thread (cost 12 is about a quarter of a second).
import bcrypt from 'bcryptjs';

/** @param {{ op: 'hash', password: string, cost: number } | { op: 'compare', password: string, hash: string }} task */
export default function passwordTask(task) {
  return task.op === 'hash' ? bcrypt.hashSync(task.password, task.cost) : bcrypt.compareSync(task.password, task.hash);
}
