import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * A rate-limit counter shared by every server instance: the hits of one key (an address, an
 * address and e-mail, a person) on one limiter in the window that ends at `resetAt`.
 * Written by the PostgreSQL store of express-rate-limit (middlewares/postgres-rate-limit-store.ts).
 */
@Entity({ name: 'rate_limit_hit' })
export class RateLimitHitEntity {
  @PrimaryColumn({ type: 'text' })
  limiter: string;

  @PrimaryColumn({ type: 'text' })
  key: string;

  @Column({ type: 'integer' })
  hits: number;

  @Column({ type: 'timestamptz', name: 'reset_at' })
  resetAt: Date;
}
