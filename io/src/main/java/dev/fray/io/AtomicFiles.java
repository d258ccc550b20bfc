package dev.fray.io;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.concurrent.ThreadLocalRandom;

/**
 * Writes files so that a reader never sees a half-written one: the bytes go to a temporary file in the target's
 * folder, are forced to disk, and the temporary file is then renamed onto the target with
 * {@link StandardCopyOption#ATOMIC_MOVE} (falling back to {@link StandardCopyOption#REPLACE_EXISTING} where the
 * file system cannot move atomically). If anything fails, the temporary file is deleted and an earlier target file
 * stays as it was. A run killed mid-write may leave a temporary file (named {@code .NAME.*.tmp}), never a
 * truncated target.
 *
 * <p>Errors: every {@link IOException} is reported as an {@link InvalidInputException} with key
 * {@link FrayMessage#FILE_ERROR} and parts (target path, reason), with the {@code IOException} as its cause. An
 * unwritable output location is treated as bad input because the user chose it; the runner maps it to its
 * bad-input exit code. Runtime exceptions thrown by the caller's body pass through unchanged (after clean-up).
 *
 * <p>Stateless; safe to use from several threads for different targets.
 */
public final class AtomicFiles {
    private static final int BUFFER_BYTES = 1 << 16;

    private AtomicFiles() {
    }

    /**
     * Writes bytes to an output stream; may throw {@link IOException}.
     *
     * @param <T> the stream type
     */
    @FunctionalInterface
    public interface IoConsumer<T> {
        /**
         * @param t the stream to write to; the caller closes it
         * @throws IOException if writing fails
         */
        void accept(T t) throws IOException;
    }

    /**
     * Writes a whole file atomically.
     *
     * @param target the file to create or replace; its folder must exist
     * @param body   writes the content into a buffered stream; must not close it
     * @throws InvalidInputException with key FILE_ERROR (target, reason) if the file cannot be written
     */
    public static void write(Path target, IoConsumer<OutputStream> body) {
        try (Pending pending = open(target)) {
            try {
                body.accept(pending.stream());
            } catch (IOException e) {
                throw fileError(target, e);
            }
            pending.commit();
        }
    }

    /**
     * Starts a file that will appear at {@code target} only when {@link Pending#commit()} is called. Use this when
     * the content is produced over time (for example one row per simulation step). Closing without committing
     * deletes the temporary file.
     *
     * @param target the file to create or replace; its folder must exist
     * @return the pending file
     * @throws InvalidInputException with key FILE_ERROR (target, reason) if the temporary file cannot be created
     */
    public static Pending open(Path target) {
        return new Pending(target);
    }

    /**
     * Moves an already complete file onto the target, atomically where the file system allows it.
     *
     * @param source complete file, in the same folder as target
     * @param target file to create or replace
     * @throws IOException if the move fails
     */
    static void moveIntoPlace(Path source, Path target) throws IOException {
        try {
            Files.move(source, target, StandardCopyOption.ATOMIC_MOVE);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(source, target, StandardCopyOption.REPLACE_EXISTING);
        }
    }

    /**
     * @param target file that failed
     * @param e      the failure
     * @return the error to throw
     */
    static InvalidInputException fileError(Path target, IOException e) {
        String reason = e.getMessage() == null ? e.getClass().getSimpleName()
                : e.getClass().getSimpleName() + ": " + e.getMessage();
        return new InvalidInputException(FrayMessage.FILE_ERROR, e, target.toString(), reason);
    }

    /**
     * A file being written to a temporary location. Not thread-safe: one writer at a time.
     */
    public static final class Pending implements AutoCloseable {
        private final Path target;
        private final Path temp;
        private final FileChannel channel;
        private final OutputStream stream;
        private boolean done;

        private Pending(Path target) {
            this.target = target.toAbsolutePath();
            Path dir = this.target.getParent();
            Path tmp = null;
            FileChannel ch = null;
            try {
                // Same folder as the target, so the final rename never crosses file systems. Not
                // Files.createTempFile: its owner-only permissions would carry over to the published file.
                for (int attempt = 0; ch == null; attempt++) {
                    tmp = dir.resolve("." + this.target.getFileName() + "."
                            + Long.toHexString(ThreadLocalRandom.current().nextLong() >>> 1) + ".tmp");
                    try {
                        ch = FileChannel.open(tmp, StandardOpenOption.WRITE, StandardOpenOption.CREATE_NEW);
                    } catch (FileAlreadyExistsException e) {
                        if (attempt >= 100) {
                            throw e;
                        }
                    }
                }
            } catch (IOException e) {
                // Nothing to clean up: the channel is the last thing that can fail and it creates the file.
                throw fileError(this.target, e);
            }
            this.temp = tmp;
            this.channel = ch;
            this.stream = new BufferedOutputStream(Channels.newOutputStream(ch), BUFFER_BYTES);
        }

        /** @return the target path (absolute) */
        public Path target() {
            return target;
        }

        /** @return the temporary file the bytes go to until {@link #commit()} */
        public Path temporaryFile() {
            return temp;
        }

        /**
         * @return the buffered stream to write to; do not close it (use {@link #commit()} or {@link #close()})
         */
        public OutputStream stream() {
            return stream;
        }

        /**
         * Flushes the buffered bytes to the temporary file (it stays temporary).
         *
         * @throws InvalidInputException with key FILE_ERROR if writing fails
         */
        public void flush() {
            try {
                stream.flush();
            } catch (IOException e) {
                throw fileError(target, e);
            }
        }

        /**
         * Flushes, forces the bytes to disk, closes the stream and renames the temporary file onto the target.
         * On failure the temporary file is deleted and the earlier target (if any) is left untouched.
         *
         * @throws InvalidInputException with key FILE_ERROR (target, reason) if the file cannot be completed
         * @throws IllegalStateException if already committed or closed
         */
        public void commit() {
            if (done) {
                throw new IllegalStateException("pending file " + target + " already committed or closed");
            }
            done = true;
            try {
                stream.flush();
                // Durable before visible: a crash after the rename must not expose an empty file.
                channel.force(true);
                stream.close();
                moveIntoPlace(temp, target);
            } catch (IOException e) {
                closeQuietly(e);
                deleteQuietly(temp, e);
                throw fileError(target, e);
            }
        }

        /** Discards the temporary file unless {@link #commit()} succeeded; never throws. */
        @Override
        public void close() {
            if (done) {
                return;
            }
            done = true;
            closeQuietly(null);
            deleteQuietly(temp, null);
        }

        private void closeQuietly(Throwable primary) {
            try {
                stream.close();
            } catch (IOException | RuntimeException e) {
                if (primary != null) {
                    primary.addSuppressed(e);
                }
            }
        }
    }

    private static void deleteQuietly(Path p, Throwable primary) {
        if (p == null) {
            return;
        }
        try {
            Files.deleteIfExists(p);
        } catch (IOException | RuntimeException e) {
            if (primary != null) {
                primary.addSuppressed(e);
            }
        }
    }
}
