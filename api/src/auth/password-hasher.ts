import { Injectable } from '@nestjs/common';
import bcrypt from 'bcryptjs';

/** Hashes and verifies passwords with bcrypt (pure-JS implementation, no native build); cost 10 keeps sign-in near 100 ms. */
@Injectable()
export class PasswordHasher {
  private readonly cost = 10;
  // A valid hash of a random string, compared against when the account does not exist so the
  // response time does not reveal whether an e-mail address is registered.
  private readonly decoy = bcrypt.hashSync('decoy-' + Math.random().toString(36), this.cost);

  hash(plain: string): Promise<string> {
    return bcrypt.hash(plain, this.cost);
  }

  verify(plain: string, hash: string | null | undefined): Promise<boolean> {
    return bcrypt.compare(plain, hash ?? this.decoy);
  }
}
