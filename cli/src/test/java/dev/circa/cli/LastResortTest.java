package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/** Messages of last resort name the command and its inputs (never the output) and no Java class. */
class LastResortTest {
    @TempDir
    Path tmp;

    /** A command that fails the way a fault of circa would: a runtime exception from inside. */
    @CommandLine.Command(name = "faulty")
    static final class Faulty implements Callable<Integer> {
        @CommandLine.Parameters(index = "0")
        Path input;

        @CommandLine.Option(names = "-o")
        Path output;

        @CommandLine.Option(names = "--debug")
        boolean debug;

        @Override
        public Integer call() {
            throw new IllegalStateException("index 7 out of bounds in java.util.ArrayList");
        }
    }

    private String[] run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new Main()).addSubcommand(new Faulty());
        int status = Main.run(cl, args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new String[] {Integer.toString(status), err.toString()};
    }

    @Test
    void internalError_noClassName_saysInternalErrorOfCirca_whatWasDone() throws Exception {
        Path in = Files.writeString(tmp.resolve("model.json"), "{}");
        Path out = Files.writeString(tmp.resolve("result.csv"), "old");
        String[] r = run("faulty", in.toString(), "-o", out.toString());
        assertEquals(Integer.toString(ExitStatus.UNUSABLE), r[0], r[1]);
        assertTrue(r[1].startsWith("circa: internal error of circa in circa faulty reading " + in + ": "), r[1]);
        assertTrue(r[1].contains("(run with --debug for the stack trace)"), r[1]);
        assertFalse(r[1].contains("IllegalStateException") || r[1].contains("java.") || r[1].contains("\tat "), r[1]);
        assertFalse(r[1].contains(out.toString()), "the output is not what was being read: " + r[1]);
        String[] debug = run("faulty", in.toString(), "--debug");
        assertTrue(debug[1].contains("\tat "), "--debug keeps the stack trace: " + debug[1]);
    }

    @Test
    void outOfMemory_namesTheInputsNotTheOutput() throws Exception {
        Path in = Files.writeString(tmp.resolve("model.json"), "{}");
        Path data = Files.writeString(tmp.resolve("data.csv"), "x\n");
        Path out = Files.writeString(tmp.resolve("out.csv"), "old");
        LastResort lr = new LastResort();
        CommandLine cl = new CommandLine(new Main());
        lr.parsed(cl.parseArgs("eval", in.toString(), "--data", data.toString(), "-o", out.toString()));
        String m = lr.outOfMemory();
        assertTrue(m.startsWith("circa: out of memory in circa eval reading " + in + ", " + data + "; "), m);
        assertFalse(m.contains(out.toString()), m);
        assertTrue(lr.stackExhausted().startsWith("circa: circa eval reading " + in + ", " + data + ": "), lr.stackExhausted());
    }
}
