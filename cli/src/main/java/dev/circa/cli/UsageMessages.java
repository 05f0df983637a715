package dev.circa.cli;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import picocli.CommandLine;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.Model.OptionSpec;

/**
 * A command-line mistake told in circa's words (the argument parser's own wording never reaches the
 * user): an unknown subcommand or option with the nearest known name, a missing or badly typed value
 * naming the option and what it takes.
 */
final class UsageMessages {
    private static final Pattern INVALID = Pattern.compile(
            "Invalid value for (?:option '([^']+)'|positional parameter at index \\d+ \\(([^)]+)\\)): '(.*)' is not an? (\\w+)");
    private static final Pattern INVALID_ENUM = Pattern.compile(
            "Invalid value for (?:option '([^']+)'|positional parameter at index \\d+ \\(([^)]+)\\)): expected one of \\[(.*)\\]"
            + " \\(case-sensitive\\) but was '(.*)'");
    private static final Pattern ONCE = Pattern.compile("option '([^']+)'.* should be specified only once");
    private static final Pattern NEEDS_VALUE = Pattern.compile("(?:Expected parameter|Missing required parameter) for option '([^']+)'");

    private UsageMessages() {
    }

    /** The message for {@code ex}, without the leading {@code circa: }. */
    static String of(CommandLine.ParameterException ex) {
        CommandLine c = ex.getCommandLine();
        if (ex instanceof CommandLine.UnmatchedArgumentException u && !u.getUnmatched().isEmpty()) {
            return unmatched(c, u.getUnmatched().get(0));
        }
        String msg = ex.getMessage() == null ? "" : ex.getMessage();
        Matcher needs = NEEDS_VALUE.matcher(msg);
        if (needs.find()) {
            return needs.group(1) + " needs a value after it";
        }
        if (ex instanceof CommandLine.MissingParameterException m && !m.getMissing().isEmpty()) {
            List<String> names = new ArrayList<>();
            for (ArgSpec a : m.getMissing()) {
                names.add(a instanceof OptionSpec o ? o.longestName() + " " + o.paramLabel() : a.paramLabel());
            }
            boolean options = m.getMissing().get(0) instanceof OptionSpec;
            return "missing " + (options ? "required option" : "argument") + (names.size() > 1 ? "s " : " ")
                    + String.join(", ", names);
        }
        Matcher m = INVALID.matcher(msg);
        if (m.find()) {
            String name = m.group(1) != null ? m.group(1) : m.group(2);
            return name + " takes " + kind(m.group(4)) + "; got '" + m.group(3) + "'";
        }
        m = INVALID_ENUM.matcher(msg);
        if (m.find()) {
            String name = m.group(1) != null ? m.group(1) : m.group(2);
            return name + " takes one of " + m.group(3) + "; got '" + m.group(4) + "'";
        }
        m = ONCE.matcher(msg);
        if (m.find()) {
            return m.group(1) + " is given more than once; give it once";
        }
        return msg.isEmpty() ? "the command line cannot be understood"
                : Character.toLowerCase(msg.charAt(0)) + msg.substring(1);
    }

    /** What a value of the named Java type is, in words. */
    private static String kind(String type) {
        switch (type.toLowerCase(Locale.ROOT)) {
            case "int", "integer", "long", "short":
                return "a whole number";
            case "double", "float":
                return "a number";
            case "boolean":
                return "true or false";
            default:
                return "a value of another kind";
        }
    }

    private static String unmatched(CommandLine c, String arg) {
        boolean top = c.getParent() == null;
        if (arg.startsWith("-") && arg.length() > 1) {
            List<String> names = new ArrayList<>();
            for (OptionSpec o : c.getCommandSpec().options()) {
                names.addAll(List.of(o.names()));
            }
            String near = nearest(arg.contains("=") ? arg.substring(0, arg.indexOf('=')) : arg, names);
            return "unknown option " + arg + (near == null ? "" : "; did you mean " + near + "?");
        }
        if (top || !c.getSubcommands().isEmpty()) {
            String near = nearest(arg, new ArrayList<>(c.getSubcommands().keySet()));
            return "unknown subcommand '" + arg + "'" + (near == null ? "; the subcommands are "
                    + String.join(", ", c.getSubcommands().keySet()) : "; did you mean '" + near + "'?");
        }
        return "unexpected argument '" + arg + "'";
    }

    /** The known name nearest to {@code typed} (edit distance at most a third of its length, at least 2), or {@code null}. */
    static String nearest(String typed, List<String> known) {
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        for (String k : known) {
            int d = distance(typed.toLowerCase(Locale.ROOT), k.toLowerCase(Locale.ROOT));
            if (d < bestDistance || (d == bestDistance && best != null && k.compareTo(best) < 0)) {
                best = k;
                bestDistance = d;
            }
        }
        int allowed = Math.max(2, typed.length() / 3);
        return bestDistance <= allowed ? best : null;
    }

    /** Levenshtein distance (insertions, deletions, substitutions; common practice), two rows. */
    private static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                cur[j] = Math.min(Math.min(cur[j - 1] + 1, prev[j] + 1), prev[j - 1] + cost);
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }
}
