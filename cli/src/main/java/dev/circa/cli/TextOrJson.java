package dev.circa.cli;

import picocli.CommandLine.Option;

/** The {@code --format} option of the reports that come as text or JSON. */
final class TextOrJson {
    /** Report forms. */
    enum Format { text, json }

    @Option(names = "--format", paramLabel = "FORMAT", description = "text (default) or json.")
    Format format = Format.text;

    /** Whether the JSON form was asked for. */
    boolean json() {
        return format == Format.json;
    }
}
