// Wakes the mail sender of this process when mail is queued, once the queuing transaction commits.
import { EventSubscriber, type EntityManager, type EntitySubscriberInterface, type QueryRunner, type TransactionCommitEvent, type TransactionRollbackEvent } from 'typeorm';

type Listener = () => void;
const listeners = new Set<Listener>();
/** Transactions that queued mail: the sender is woken when they commit (earlier it would find nothing). */
const queuedIn = new WeakSet<QueryRunner>();

/** Calls `listener` whenever mail queued in this process is committed; returns the unsubscribe. */
export function onMailQueued(listener: Listener): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function wake(): void {
  for (const listener of listeners) listener();
}

/** Called by enqueueMail with the manager it inserted through. */
export function mailQueued(manager: EntityManager): void {
  const runner = manager.queryRunner;
  if (runner?.isTransactionActive) queuedIn.add(runner);
  else wake();
}

/** Registered on every data source: turns the commit of a transaction that queued mail into a wake-up. */
@EventSubscriber()
export class MailQueuedSubscriber implements EntitySubscriberInterface {
  afterTransactionCommit(event: TransactionCommitEvent): void {
    // a savepoint's release commits nothing yet; the outermost commit does
    if (event.queryRunner.isTransactionActive || !queuedIn.has(event.queryRunner)) return;
    queuedIn.delete(event.queryRunner);
    wake();
  }

  afterTransactionRollback(event: TransactionRollbackEvent): void {
    if (!event.queryRunner.isTransactionActive) queuedIn.delete(event.queryRunner);
  }
}
