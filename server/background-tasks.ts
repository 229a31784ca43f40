import type { Logger } from './logger';

/**
 * Work a request starts but does not wait for (a password reset's token and e-mail, so the
 * answer takes the same time whether the address has an account). Errors are logged, never
 * thrown at the caller; `idle()` waits for everything started so far (shutdown, tests).
 */
export interface BackgroundTasks {
  run(name: string, task: () => Promise<void>): void;
  idle(): Promise<void>;
}

export function createBackgroundTasks(logger: Logger): BackgroundTasks {
  const running = new Set<Promise<void>>();
  return {
    run(name, task) {
      const done: Promise<void> = Promise.resolve()
        .then(task)
        .catch((err: unknown) => logger.error('Background task failed', { task: name, err }))
        .finally(() => running.delete(done));
      running.add(done);
    },
    async idle() {
      while (running.size > 0) await Promise.allSettled([...running]);
    },
  };
}
