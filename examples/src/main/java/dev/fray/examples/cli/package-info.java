/**
 * The {@code fray} command-line runner ({@link dev.fray.examples.cli.FrayCommand}) and its subcommands
 * {@code run}, {@code check}, {@code resume}, {@code info}, {@code demo} and {@code bench}, with exit codes that
 * tell bad input, a diverged simulation and an internal error apart.
 */
package dev.fray.examples.cli;
