package dev.fray.examples.cli;

import picocli.CommandLine.Option;
import picocli.CommandLine.ParseResult;

/** The {@code --debug} flag, mixed into every command so it may appear anywhere on the command line. */
public final class DebugOption {
    /** Option name. */
    static final String NAME = "--debug";

    @Option(names = NAME, description = "Print stack traces of errors.")
    private boolean debug;

    /** Created by picocli. */
    public DebugOption() {
    }

    /** @return whether --debug was given to this command */
    public boolean enabled() {
        return debug;
    }

    /**
     * @param parsed result of parsing, may be null
     * @return whether --debug was given to the command or any subcommand
     */
    static boolean requested(ParseResult parsed) {
        for (ParseResult p = parsed; p != null; p = p.subcommand()) {
            if (p.hasMatchedOption(NAME)) {
                return true;
            }
        }
        return false;
    }

    /**
     * Used where parsing failed, so no parse result exists.
     *
     * @param args raw arguments
     * @return whether "--debug" is among them
     */
    static boolean requested(String[] args) {
        for (String a : args) {
            if (NAME.equals(a)) {
                return true;
            }
        }
        return false;
    }
}
