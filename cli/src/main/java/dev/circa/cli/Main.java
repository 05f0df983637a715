package dev.circa.cli;

import dev.circa.format.io.FormatException;
import java.io.PrintWriter;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** Entry point of the {@code circa} command line. */
@Command(name = "circa", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Validate, convert, check and evaluate probabilistic circuit files.",
        subcommands = {
            ValidateCommand.class,
            ConvertCommand.class,
            RegionsCommand.class,
            EvalCommand.class,
            ImputeCommand.class,
            SampleCommand.class,
            InspectCommand.class,
            CheckCommand.class, CompareCommand.class, NormalizeCommand.class, RenderCommand.class,
            ReportCommand.class,
            DemoCommand.class,
            CertifyCommand.class,
            CommandLine.HelpCommand.class
        })
public final class Main implements Runnable {
    /** The version printed by {@code --version}. */
    public static final String VERSION = "0.1.0";

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "a subcommand is required");
    }

    /** Runs the command line and exits with its status. */
    public static void main(String[] args) {
        PrintWriter err = new PrintWriter(System.err, true);
        Progress.useTerminal(err);
        System.exit(run(args, new PrintWriter(System.out, true), err));
    }

    /** Runs the command line with the given streams and returns the exit status (for tests). */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        return run(new CommandLine(new Main()), args, out, err);
    }

    /** Runs {@code cl} (the command line, or one with subcommands added by a test) as {@link #run(String[], PrintWriter, PrintWriter)}. */
    static int run(CommandLine cl, String[] args, PrintWriter out, PrintWriter err) {
        for (CommandLine sub : cl.getSubcommands().values()) {
            summarise(sub.getCommandSpec());
        }
        cl.setOut(out);
        cl.setErr(err);
        boolean debug = java.util.Arrays.asList(args).contains("--debug");
        cl.setParameterExceptionHandler((ex, a) -> {
            CommandLine c = ex.getCommandLine();
            c.getErr().println("circa: " + UsageMessages.of(ex));
            c.getErr().println("Try 'circa " + commandPath(c) + "--help' for the options.");
            return ExitStatus.UNUSABLE;
        });
        LastResort lastResort = new LastResort();
        cl.setExecutionExceptionHandler((ex, c, parsed) -> {
            if (ex instanceof FormatException || ex instanceof UsageException) {
                c.getErr().println("circa: " + ex.getMessage());
            } else {
                c.getErr().println(lastResort.internal(debug));
            }
            if (debug) {
                ex.printStackTrace(c.getErr());
            }
            return ExitStatus.UNUSABLE;
        });
        cl.setExecutionStrategy(parsed -> {
            lastResort.parsed(parsed);
            StandardInputOnce.check(parsed);
            OptionValues.check(parsed);
            OutputTargets.check(parsed);
            return new CommandLine.RunLast().execute(parsed);
        });
        try {
            return cl.execute(args);
        } catch (StackOverflowError e) {
            err.println(lastResort.stackExhausted());
            return ExitStatus.UNUSABLE;
        } catch (OutOfMemoryError e) {
            err.println(lastResort.outOfMemory());
            return ExitStatus.UNUSABLE;
        }
    }

    private static String commandPath(CommandLine c) {
        String q = c.getCommandSpec().qualifiedName();
        return q.startsWith("circa ") ? q.substring(6) + " " : "";
    }

    /**
     * Gives a command's help one flowing text: the first sentence of its description becomes the
     * header (its whole entry in the list of subcommands, never cut), and the rest follows as one
     * paragraph that the help wraps to the terminal, whatever line breaks its source has.
     */
    static void summarise(CommandLine.Model.CommandSpec spec) {
        String[] d = spec.usageMessage().description();
        if (d.length == 0 || spec.usageMessage().header().length > 0) {
            return;
        }
        String text = String.join(" ", d).replaceAll("\\s+", " ").trim();
        int end = text.indexOf(". ");
        String first = end < 0 ? text : text.substring(0, end + 1);
        String rest = end < 0 ? "" : text.substring(end + 2).trim();
        spec.usageMessage().header(first);
        spec.usageMessage().description(rest.isEmpty() ? new String[0] : new String[] {rest});
        for (CommandLine sub : spec.subcommands().values()) {
            summarise(sub.getCommandSpec());
        }
    }

    /** Supplies {@code --version}. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            return new String[] {"circa " + VERSION};
        }
    }
}
