/**
 * The command line: picocli commands that parse their options, call the package that does the work
 * (a lot through {@code lot}, one part, the check standard and re-analysis through {@code records}
 * and {@code traces}, studies, reports, the service, the simulator, benchmarks) and print what came
 * of it, with the exit codes the README documents.
 */
package org.lrbench.cli;
