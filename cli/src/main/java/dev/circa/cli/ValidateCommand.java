package dev.circa.cli;
/** SCRATCH stand-in for local compilation only; never committed. */
@picocli.CommandLine.Command(name = "validate")
final class ValidateCommand implements java.util.concurrent.Callable<Integer> {
    @Override
    public Integer call() { return 0; }
}
