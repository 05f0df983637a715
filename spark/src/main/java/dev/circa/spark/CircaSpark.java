package dev.circa.spark;

import dev.circa.cli.ExitStatus;
import dev.circa.cli.UsageException;
import dev.circa.format.io.FormatException;
import java.io.PrintWriter;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** Entry point of {@code circa-spark} (and of {@code spark-submit --class dev.circa.spark.CircaSpark}). */
@Command(name = "circa-spark", mixinStandardHelpOptions = true, version = "circa-spark 0.1.0",
        description = "Score data and run regression checks on Apache Spark, with circa's numbers.",
        subcommands = {SparkScoreCommand.class, SparkCheckCommand.class, CommandLine.HelpCommand.class})
public final class CircaSpark implements Runnable {
    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "a subcommand is required (score or check)");
    }

    /** Runs the command line and exits with its status. */
    public static void main(String[] args) {
        System.exit(run(args, new PrintWriter(System.out, true), new PrintWriter(System.err, true)));
    }

    /** Runs the command line with the given streams and returns the exit status (for tests and applications). */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        CommandLine cl = new CommandLine(new CircaSpark());
        cl.setOut(out);
        cl.setErr(err);
        boolean debug = java.util.Arrays.asList(args).contains("--debug");
        cl.setParameterExceptionHandler((ex, a) -> {
            ex.getCommandLine().getErr().println("circa-spark: " + ex.getMessage());
            ex.getCommandLine().getErr().println("Try 'circa-spark --help' for the options.");
            return ExitStatus.UNUSABLE;
        });
        cl.setExecutionExceptionHandler((ex, c, parsed) -> {
            boolean ours = ex instanceof FormatException || ex instanceof UsageException || ex instanceof DataValueException;
            c.getErr().println("circa-spark: " + (ours ? "" : "unexpected error: ") + ex.getMessage());
            if (debug) {
                ex.printStackTrace(c.getErr());
            } else if (!ours) {
                c.getErr().println("(run with --debug for the stack trace)");
            }
            return ExitStatus.UNUSABLE;
        });
        return cl.execute(args);
    }
}
