package dev.fray.io.mesh;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Arrays;

/**
 * Reads a whole mesh file into memory and builds the readers' error messages. Reading everything first lets the
 * binary readers check declared counts against the bytes actually present before allocating anything.
 */
final class MeshBytes {
    /** Largest file the readers accept: the largest Java array, less a margin. */
    static final long MAX_BYTES = Integer.MAX_VALUE - 64L;

    private MeshBytes() {
    }

    /**
     * @param file the file
     * @return its bytes
     * @throws InvalidInputException FILE_ERROR (file, reason) if it cannot be read or is too large
     */
    static byte[] read(Path file) {
        if (file == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh file");
        }
        try {
            long size = Files.size(file);
            if (size > MAX_BYTES) {
                throw tooLarge(file.toString(), size);
            }
            return Files.readAllBytes(file);
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "file not found");
        } catch (AccessDeniedException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "permission denied");
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(),
                    "cannot read: " + e.getClass().getSimpleName()
                            + (e.getMessage() == null ? "" : ": " + e.getMessage()));
        } catch (OutOfMemoryError e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(),
                    "not enough memory to read the file");
        }
    }

    /**
     * @param in   the stream (read to its end, not closed)
     * @param name name for messages
     * @return its bytes
     * @throws InvalidInputException FILE_ERROR (name, reason) if it cannot be read or is too large
     */
    static byte[] read(InputStream in, String name) {
        if (in == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh input stream");
        }
        byte[] buf = new byte[8192];
        int n = 0;
        try {
            while (true) {
                if (n == buf.length) {
                    if (buf.length >= MAX_BYTES) {
                        throw tooLarge(name, n);
                    }
                    buf = Arrays.copyOf(buf, (int) Math.min(MAX_BYTES, 2L * buf.length));
                }
                int r = in.read(buf, n, buf.length - n);
                if (r < 0) {
                    break;
                }
                n += r;
            }
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, name,
                    "cannot read: " + e.getClass().getSimpleName()
                            + (e.getMessage() == null ? "" : ": " + e.getMessage()));
        }
        return n == buf.length ? buf : Arrays.copyOf(buf, n);
    }

    private static InvalidInputException tooLarge(String name, long size) {
        return new InvalidInputException(FrayMessage.FILE_ERROR, name,
                "file of " + size + " bytes is too large; at most " + MAX_BYTES + " bytes are supported");
    }

    /**
     * @param name   file name
     * @param where  "line 12", "byte 84", ...
     * @param reason what is wrong and what is allowed
     * @return the error
     */
    static InvalidInputException error(String name, String where, String reason) {
        return new InvalidInputException(FrayMessage.FILE_ERROR, name, where + ": " + reason);
    }

    /**
     * @param b     bytes
     * @param start first byte
     * @param end   end (exclusive)
     * @return the bytes as printable text for a message: at most 40 characters, others escaped
     */
    static String quote(byte[] b, int start, int end) {
        StringBuilder s = new StringBuilder("\"");
        int stop = Math.min(end, start + 40);
        for (int i = start; i < stop; i++) {
            int c = b[i] & 0xff;
            if (c >= 0x20 && c < 0x7f && c != '"' && c != '\\') {
                s.append((char) c);
            } else {
                s.append(String.format(java.util.Locale.ROOT, "\\x%02x", c));
            }
        }
        if (end > stop) {
            s.append("...");
        }
        return s.append('"').toString();
    }
}
