/**
 * Readers and writers of Fray's files, and the shared helper {@link dev.fray.io.AtomicFiles} through which every
 * output file is written (temporary file, then atomic rename).
 */
package dev.fray.io;
