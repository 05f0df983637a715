package dev.circa.report;

/** The README's warning at the top of every report: what a valid file proves and what it does not. */
final class CautionSection {
    /** The sentence, as the README has it. */
    static final String HEADLINE = "A valid file is not a good model.";
    /** Its explanation, as the README has it. */
    static final String EXPLANATION = "circa proves structure and numbers: that a file is a well-formed circuit, "
            + "which properties hold, that it integrates to one, that it reproduces given reference values. It says "
            + "nothing about whether the model fits its data or is fit for a decision. Models that affect people or "
            + "equipment follow their owners' review rules.";

    private CautionSection() {
    }

    static void write(Html html) {
        html.raw("<aside class=\"caution\" id=\"caution\"><p><strong>").text(HEADLINE).raw("</strong> ")
                .text(EXPLANATION).raw("</p><p>").text("This page shows what was proven and computed about the file "
                        + "named below. Whether the model should be deployed is for its owners to decide under their "
                        + "own review rules.").raw("</p></aside>\n");
    }
}
