package dev.fray.core.parallel;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayInternalException;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;

/**
 * The worker threads of one simulation. Work is split into tasks whose boundaries never depend on the thread
 * count; which thread runs which task does not matter for the result because tasks write disjoint data and every
 * reduction is combined per task in task order. Each running task gets a worker index in [0, threads) to pick its
 * scratch space.
 */
public final class Workers implements AutoCloseable {
    /** Body of a parallel loop over tasks. */
    @FunctionalInterface
    public interface Task {
        /**
         * @param worker index of the running worker, for scratch space, in [0, threads)
         * @param task   task number
         */
        void run(int worker, int task);
    }

    private final int threads;
    private final ExecutorService pool;

    /**
     * @param threads number of threads, 1 to 1024; 1 runs everything on the caller
     */
    public Workers(int threads) {
        this.threads = Checks.inRange("threads", threads, 1, 1024);
        if (threads == 1) {
            pool = null;
        } else {
            AtomicInteger count = new AtomicInteger();
            pool = Executors.newFixedThreadPool(threads - 1, r -> {
                Thread t = new Thread(r, "fray-worker-" + count.incrementAndGet());
                t.setDaemon(true);
                return t;
            });
        }
    }

    /** @return number of threads, including the caller */
    public int threads() {
        return threads;
    }

    /**
     * Runs {@code body} for every task in [0, tasks), the caller taking part, and returns when all are done.
     *
     * @param tasks number of tasks
     * @param body  the work
     */
    public void forEach(int tasks, Task body) {
        if (tasks <= 0) {
            return;
        }
        if (pool == null || tasks == 1) {
            for (int t = 0; t < tasks; t++) {
                body.run(0, t);
            }
            return;
        }
        AtomicInteger next = new AtomicInteger();
        AtomicReference<Throwable> failure = new AtomicReference<>();
        int helpers = Math.min(threads - 1, tasks - 1);
        Future<?>[] futures = new Future<?>[helpers];
        for (int h = 0; h < helpers; h++) {
            final int worker = h + 1;
            futures[h] = pool.submit(() -> drain(worker, tasks, next, failure, body));
        }
        drain(0, tasks, next, failure, body);
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new FrayInternalException("interrupted while waiting for workers", e);
            } catch (java.util.concurrent.ExecutionException e) {
                failure.compareAndSet(null, e.getCause());
            }
        }
        Throwable t = failure.get();
        if (t instanceof RuntimeException re) {
            throw re;
        }
        if (t instanceof Error err) {
            throw err;
        }
        if (t != null) {
            throw FrayInternalException.internal(t);
        }
    }

    private static void drain(int worker, int tasks, AtomicInteger next, AtomicReference<Throwable> failure, Task body) {
        int t;
        while (failure.get() == null && (t = next.getAndIncrement()) < tasks) {
            try {
                body.run(worker, t);
            } catch (Throwable e) {
                failure.compareAndSet(null, e);
            }
        }
    }

    /** Stops the threads. */
    @Override
    public void close() {
        if (pool != null) {
            pool.shutdownNow();
        }
    }
}
