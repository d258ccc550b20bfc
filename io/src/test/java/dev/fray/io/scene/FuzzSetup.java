package dev.fray.io.scene;

/**
 * Shared set-up of the fuzz tests. In regression mode (every build) Jazzer's instrumentation hooks only add
 * sanitizers that do not apply to a file reader, yet cost about 15 s of start-up and print a line to standard
 * error for every class loaded afterwards, which breaks the quiet-test rule of later tests in the same JVM. So they
 * are switched off through Jazzer's own configuration parameter, unless a build sets it or is actually fuzzing
 * ({@code JAZZER_FUZZ}), which needs the instrumentation.
 */
public final class FuzzSetup {
    private FuzzSetup() {
    }

    /** Call from a {@code @BeforeAll} method of each fuzz test class. */
    public static void regressionModeWithoutHooks() {
        if (System.getenv("JAZZER_FUZZ") == null && System.getProperty("jazzer.hooks") == null) {
            System.setProperty("jazzer.hooks", "false");
        }
    }
}
