import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';
import { availableParallelism } from 'node:os';
import bcrypt from 'bcryptjs';

/**
 * scrypt settings for new hashes. The cost (log2 of N) comes from PASSWORD_HASH_COST; r and p
 * are fixed. N = 2^15, r = 8 takes 128·N·r = 32 MiB and about 0.2 s on a 2-core server.
 */
export const SCRYPT_BLOCK_SIZE = 8;
export const SCRYPT_PARALLELISM = 1;
/** Random salt per hash, and the derived key's length, in bytes. */
export const SALT_BYTES = 16;
export const KEY_BYTES = 32;
/** log2 N for new hashes unless configured otherwise; the lowest allowed in production. */
export const DEFAULT_HASH_COST = 15;

/**
 * Hashes running at once, process-wide. scrypt is CPU- and memory-bound: with every core hashing,
 * the main thread waits for a core and every request slows down (on 2 cores, 4 pool threads
 * hashing stalled the event loop for 100+ ms). Keeping one core free keeps the server answering;
 * a flood of sign-ins waits its turn instead (and the sign-in limiter bounds that flood).
 */
const HASHES_AT_ONCE = Math.max(1, availableParallelism() - 1);

/** What a stored scrypt hash says about itself. */
interface ScryptHash {
  readonly logN: number;
  readonly r: number;
  readonly p: number;
  readonly salt: Buffer;
  readonly key: Buffer;
}

// PHC string format, e.g. `$scrypt$ln=15,r=8,p=1$<salt>$<key>` (unpadded base64), so a stored
// hash keeps its own parameters and stays verifiable when the defaults change.
const SCRYPT_FORMAT =
  /^\$scrypt\$ln=(\d{1,2}),r=(\d{1,2}),p=(\d{1,2})\$([A-Za-z0-9+/]+)\$([A-Za-z0-9+/]+)$/;
// Hashes written before scrypt (bcryptjs). Still verified, and replaced at the next sign-in.
const BCRYPT_FORMAT = /^\$2[aby]\$\d\d\$/;

/**
 * Hashes and checks passwords with Node's asynchronous scrypt, which runs on libuv's thread pool:
 * a sign-in never holds up other requests while its password is checked.
 */
export class PasswordHasher {
  /** @param cost log2 of scrypt's N for new hashes. */
  constructor(readonly cost: number = DEFAULT_HASH_COST) {}

  /** A new self-describing hash of `password` with a fresh random salt. */
  async hash(password: string): Promise<string> {
    const salt = randomBytes(SALT_BYTES);
    const params = { logN: this.cost, r: SCRYPT_BLOCK_SIZE, p: SCRYPT_PARALLELISM };
    const key = await deriveKey(password, salt, KEY_BYTES, params);
    return `$scrypt$ln=${params.logN},r=${params.r},p=${params.p}$${b64(salt)}$${b64(key)}`;
  }

  /** True when `password` matches `stored` (scrypt, or a bcrypt hash from before). */
  async verify(password: string, stored: string): Promise<boolean> {
    if (BCRYPT_FORMAT.test(stored)) return bcrypt.compare(password, stored);
    const parsed = parseScrypt(stored);
    const key = await deriveKey(password, parsed.salt, parsed.key.length, parsed);
    return timingSafeEqual(key, parsed.key);
  }

  /** True when `stored` is not a scrypt hash with today's parameters. */
  needsRehash(stored: string): boolean {
    if (BCRYPT_FORMAT.test(stored)) return true;
    const parsed = parseScrypt(stored);
    return (
      parsed.logN !== this.cost ||
      parsed.r !== SCRYPT_BLOCK_SIZE ||
      parsed.p !== SCRYPT_PARALLELISM ||
      parsed.salt.length !== SALT_BYTES ||
      parsed.key.length !== KEY_BYTES
    );
  }
}

function parseScrypt(stored: string): ScryptHash {
  const match = SCRYPT_FORMAT.exec(stored);
  const [logN, r, p] = [match?.[1], match?.[2], match?.[3]].map(Number);
  if (!match || !(logN! >= 1 && logN! <= 22 && r! >= 1 && p! >= 1)) {
    // Never "no match": a hash this code cannot read is a fault to look at, not a wrong password.
    throw new Error('The stored password hash has an unknown format');
  }
  return {
    logN: logN!,
    r: r!,
    p: p!,
    salt: Buffer.from(match[4]!, 'base64'),
    key: Buffer.from(match[5]!, 'base64'),
  };
}

function deriveKey(
  password: string,
  salt: Buffer,
  length: number,
  params: { logN: number; r: number; p: number },
): Promise<Buffer> {
  const N = 2 ** params.logN;
  const options: ScryptOptions = {
    N,
    r: params.r,
    p: params.p,
    // Node refuses when 128·N·r exceeds maxmem (32 MiB by default, exactly our N = 2^15 need).
    maxmem: 256 * N * params.r,
  };
  return hashSlots.run(
    () =>
      new Promise((resolve, reject) => {
        scrypt(password, salt, length, options, (error, key) =>
          error ? reject(error) : resolve(key),
        );
      }),
  );
}

/** A counting semaphore: at most `size` tasks run at once, the rest wait in arrival order. */
class Slots {
  private running = 0;
  private readonly waiting: (() => void)[] = [];

  constructor(private readonly size: number) {}

  async run<T>(task: () => Promise<T>): Promise<T> {
    if (this.running >= this.size) {
      await new Promise<void>((resolve) => this.waiting.push(resolve));
    } else {
      this.running++;
    }
    try {
      return await task();
    } finally {
      // Hand the slot straight to the next waiter, so `running` never drops below the demand.
      const next = this.waiting.shift();
      if (next) next();
      else this.running--;
    }
  }
}

const hashSlots = new Slots(HASHES_AT_ONCE);

function b64(bytes: Buffer): string {
  return bytes.toString('base64').replace(/=+$/, '');
}
