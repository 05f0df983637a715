package dev.circa.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** Runs the command line in-process and captures its streams (test helper). */
final class CliRunner {
    final int status;
    final String out;
    final String err;

    private CliRunner(int status, String out, String err) {
        this.status = status;
        this.out = out;
        this.err = err;
    }

    static CliRunner run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new CliRunner(status, out.toString(), err.toString());
    }
}
