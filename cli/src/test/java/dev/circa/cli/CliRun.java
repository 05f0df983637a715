package dev.circa.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** Runs the command line in-process with captured standard output and error. */
record CliRun(int status, String out, String err) {
    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new CliRun(status, out.toString(), err.toString());
    }

    @Override
    public String toString() {
        return "status " + status + "\n--- out\n" + out + "--- err\n" + err;
    }
}
