import { databaseAnswers } from '../data';
import { mailTransport } from '../mail/transport';
import { storageReachable } from '../storage/s3';

type Status = 'ok' | 'down';

function withTimeout<T>(p: Promise<T>, ms: number): Promise<T> {
  return Promise.race([p, new Promise<T>((_, reject) => setTimeout(() => reject(new Error('timeout')), ms))]);
}

const probe = (p: () => Promise<unknown>): Promise<Status> =>
  withTimeout(p(), 4000).then(
    (v) => (v === false ? 'down' : 'ok'),
    () => 'down',
  );

export async function health(): Promise<{ db: Status; storage: Status; mail: Status }> {
  const [dbStatus, storage, mail] = await Promise.all([
    probe(databaseAnswers),
    probe(() => storageReachable()),
    probe(() => mailTransport().verify()),
  ]);
  return { db: dbStatus, storage, mail };
}
