package dev.fray.examples.cli;

import dev.fray.core.error.FrayError;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.error.SimulationDivergedException;
import dev.fray.io.scene.SceneFileException;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.ParseResult;
import picocli.CommandLine.Spec;

/**
 * The {@code fray} command-line runner: {@code fray run SCENE --out DIR} runs a scene file, {@code fray check
 * SCENE} validates one and says what a run would cost, {@code fray resume CHECKPOINT} continues a run,
 * {@code fray info FILE} says what an output file holds, {@code fray demo ...} runs a built-in demo scene and
 * {@code fray bench ...} a standard benchmark.
 *
 * <p>Exit codes: {@link #OK} success, {@link #BAD_INPUT} bad input (an {@link InvalidInputException} or a usage
 * error), {@link #DIVERGED} the simulation diverged ({@link SimulationDivergedException}), {@link #INTERNAL} any
 * other failure. Errors print one line to standard error (a scene file with several problems: one line each);
 * {@code --debug} adds the stack trace.
 */
@Command(name = "fray", mixinStandardHelpOptions = true, versionProvider = FrayCommand.Version.class,
        description = "Simulates solids that crack, tear and peel with the material point method.",
        subcommands = {RunCommand.class, CheckCommand.class, ResumeCommand.class, InfoCommand.class,
            DemoCommand.class, BenchCommand.class, StiffBenchCommand.class, CommandLine.HelpCommand.class})
public final class FrayCommand implements Callable<Integer> {
    /** Exit code: success. */
    public static final int OK = 0;
    /** Exit code: bad input (invalid value, unknown name, unusable file, usage error). */
    public static final int BAD_INPUT = 2;
    /** Exit code: the simulation diverged. */
    public static final int DIVERGED = 3;
    /** Exit code: internal error (a bug, or the machine ran out of memory). */
    public static final int INTERNAL = 4;

    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    /** Created by picocli. */
    public FrayCommand() {
    }

    /**
     * Runs the command line and exits the JVM with its exit code.
     *
     * @param args command-line arguments
     */
    public static void main(String[] args) {
        CommandLine cl = newCommandLine();
        int code;
        try {
            code = cl.execute(args);
        } catch (Throwable t) {
            // Errors (out of memory, stack overflow) bypass picocli's exception handlers.
            PrintWriter err = cl.getErr();
            err.println("fray: " + describe(t));
            if (DebugOption.requested(args)) {
                t.printStackTrace(err);
            }
            err.flush();
            code = INTERNAL;
        }
        System.exit(code);
    }

    /**
     * Builds the command line with Fray's error handling and exit codes, for {@link #main} and for tests that run
     * the command in-process (set its out and err writers to capture output).
     *
     * @return a fresh command line
     */
    public static CommandLine newCommandLine() {
        CommandLine cl = new CommandLine(new FrayCommand());
        cl.setParameterExceptionHandler(FrayCommand::onUsageError);
        cl.setExecutionExceptionHandler(FrayCommand::onFailure);
        return cl;
    }

    /**
     * Without a subcommand there is nothing to do.
     *
     * @return never returns normally
     * @throws ParameterException always, asking for a subcommand
     */
    @Override
    public Integer call() {
        throw new ParameterException(spec.commandLine(),
                "missing command: choose one of " + String.join(", ", spec.subcommands().keySet()));
    }

    private static int onUsageError(ParameterException ex, String[] args) {
        CommandLine cl = ex.getCommandLine();
        PrintWriter err = cl.getErr();
        err.println("fray: " + oneLine(ex.getMessage()) + " (see '" + cl.getCommandSpec().qualifiedName()
                + " --help')");
        if (DebugOption.requested(args)) {
            ex.printStackTrace(err);
        }
        err.flush();
        return BAD_INPUT;
    }

    private static int onFailure(Exception ex, CommandLine cl, ParseResult parsed) {
        PrintWriter err = cl.getErr();
        err.println("fray: " + describe(ex));
        if (DebugOption.requested(parsed)) {
            ex.printStackTrace(err);
        }
        err.flush();
        return exitCode(ex);
    }

    /**
     * @param t a failure
     * @return the exit code for it: the first Fray error in its cause chain decides
     */
    static int exitCode(Throwable t) {
        FrayError e = frayError(t);
        if (e instanceof InvalidInputException) {
            return BAD_INPUT;
        }
        if (e instanceof SimulationDivergedException) {
            return DIVERGED;
        }
        return INTERNAL;
    }

    private static String describe(Throwable t) {
        FrayError e = frayError(t);
        if (e instanceof SceneFileException sfe) {
            // One line per problem, so that a user sees them all and can fix them in one go.
            return sfe.getMessage().replace("\r", " ");
        }
        if (e != null) {
            return oneLine(((Throwable) e).getMessage());
        }
        if (t instanceof OutOfMemoryError) {
            return "out of memory; give Java more heap (-Xmx) or use fewer particles";
        }
        return "internal error: " + oneLine(String.valueOf(t)) + " (run with --debug for the stack trace)";
    }

    private static FrayError frayError(Throwable t) {
        for (Throwable c = t; c != null; c = c.getCause()) {
            if (c instanceof FrayError f) {
                return f;
            }
            if (c.getCause() == c) {
                break;
            }
        }
        return null;
    }

    private static String oneLine(String s) {
        return s == null ? "" : s.replace("\r", " ").replace("\n", " ").trim();
    }

    /** Reports the version recorded in the jar manifest, if any. */
    static final class Version implements CommandLine.IVersionProvider {
        /** {@inheritDoc} */
        @Override
        public String[] getVersion() {
            String v = FrayCommand.class.getPackage().getImplementationVersion();
            return new String[] {"fray " + (v == null ? "(development build)" : v)};
        }
    }
}
