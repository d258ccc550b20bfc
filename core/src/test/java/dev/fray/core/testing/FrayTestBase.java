package dev.fray.core.testing;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.Random;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.parallel.ResourceLock;
import org.junit.jupiter.api.parallel.Resources;

/**
 * Base class for Fray's JUnit 5 tests: a fresh seeded {@link Random} per test, and a test that writes to
 * {@code System.out} or {@code System.err} fails. This is the idea of EJML's {@code EjmlStandardJUnit}.
 *
 * <p>Tests must be quiet because the library logs through SLF4J and never prints. Stray output from a test or from
 * the code under test is treated as a bug. The streams are swapped before each test and restored after it, so this
 * class takes JUnit's locks on {@link Resources#SYSTEM_OUT} and {@link Resources#SYSTEM_ERR}. Tests from these
 * classes therefore do not run concurrently with each other, even when parallel execution is enabled.
 *
 * <p>Parameterized tests get a fresh {@link #rand} per invocation, so every invocation sees the same sequence.
 * Derive a {@code new Random(seed)} from the parameters when each invocation needs its own sequence.
 */
@ResourceLock(Resources.SYSTEM_OUT)
@ResourceLock(Resources.SYSTEM_ERR)
public abstract class FrayTestBase {
    /** Seed of {@link #rand}, as in EJML's test base class. */
    public static final long SEED = 345;

    /** Longest captured output quoted in a failure message. */
    private static final int QUOTE_LIMIT = 500;

    /** Random generator seeded with {@link #SEED}, re-created before every test. */
    protected Random rand;

    private PrintStream savedOut;
    private PrintStream savedErr;
    private ByteArrayOutputStream capturedOut;
    private ByteArrayOutputStream capturedErr;

    /** Creates the base; subclasses need no constructor of their own. */
    protected FrayTestBase() {
    }

    /** Re-seeds {@link #rand} and redirects the standard streams into buffers. Final, so it cannot be skipped. */
    @BeforeEach
    protected final void frayTestBaseSetUp() {
        rand = new Random(SEED);
        savedOut = System.out;
        savedErr = System.err;
        capturedOut = new ByteArrayOutputStream();
        capturedErr = new ByteArrayOutputStream();
        System.setOut(new PrintStream(capturedOut, true, StandardCharsets.UTF_8));
        System.setErr(new PrintStream(capturedErr, true, StandardCharsets.UTF_8));
    }

    /** Restores the standard streams, then fails the test if anything was written to them. */
    @AfterEach
    protected final void frayTestBaseTearDown() {
        System.out.flush();
        System.err.flush();
        System.setOut(savedOut);
        System.setErr(savedErr);
        String out = capturedOut.toString(StandardCharsets.UTF_8);
        String err = capturedErr.toString(StandardCharsets.UTF_8);
        if (!out.isEmpty() || !err.isEmpty()) {
            fail("test wrote to the standard streams; tests and library code must stay quiet."
                    + (out.isEmpty() ? "" : " System.out: \"" + quote(out) + "\"")
                    + (err.isEmpty() ? "" : " System.err: \"" + quote(err) + "\""));
        }
    }

    private static String quote(String s) {
        return s.length() <= QUOTE_LIMIT ? s : s.substring(0, QUOTE_LIMIT) + "...";
    }
}
