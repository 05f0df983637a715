package dev.circa.format.mixture;

import dev.circa.format.io.FormatException;
import java.io.Reader;
import java.util.Optional;
import org.snakeyaml.engine.v2.events.AliasEvent;
import org.snakeyaml.engine.v2.events.CollectionStartEvent;
import org.snakeyaml.engine.v2.events.Event;
import org.snakeyaml.engine.v2.events.NodeEvent;
import org.snakeyaml.engine.v2.events.ScalarEvent;
import org.snakeyaml.engine.v2.exceptions.Mark;
import tools.jackson.core.ObjectReadContext;
import tools.jackson.core.exc.StreamReadException;
import tools.jackson.core.io.IOContext;
import tools.jackson.dataformat.yaml.YAMLFactory;
import tools.jackson.dataformat.yaml.YAMLFactoryBuilder;
import tools.jackson.dataformat.yaml.YAMLParser;

/**
 * The YAML parsers of mixture documents, which see every YAML event (the token view hides some: an
 * anchor on a scalar value, a tag on a key) and apply one rule, documented in FORMAT.md's words
 * "YAML 1.2, core schema": no anchor ({@code &name}), alias ({@code *name}) or tag ({@code !tag},
 * {@code !!str}) anywhere in the document. A model shares a sub-model through {@code definitions} and
 * {@code use}, and a value's type is the core schema's reading of it (quote a label that looks like a
 * number). Each breach is a located error naming what was found.
 */
final class CoreYamlFactory extends YAMLFactory {
    private static final long serialVersionUID = 1L;

    private final String file;

    CoreYamlFactory(YAMLFactoryBuilder builder, String file) {
        super(builder);
        this.file = file;
    }

    @Override
    protected YAMLParser _createParser(ObjectReadContext ctxt, IOContext io, Reader r) {
        return new Parser(ctxt, io, this, r);
    }

    /** A YAML parser that refuses anchors, aliases and tags at the event level. */
    private static final class Parser extends YAMLParser {
        private final String file;

        Parser(ObjectReadContext ctxt, IOContext io, CoreYamlFactory f, Reader r) {
            super(ctxt, io, f._getBufferRecycler(), ctxt.getStreamReadFeatures(f._streamReadFeatures),
                    ctxt.getFormatReadFeatures(f._formatReadFeatures), f._loadSettings, r, true);
            this.file = f.file;
        }

        @Override
        protected Event nextEvent() {
            Event e = super.nextEvent();
            if (e instanceof AliasEvent a) {
                throw refuse(e, "the YAML alias *" + a.getAlias() + " is not allowed in a mixture document; expected a"
                        + " plain value (share a sub-model with definitions and use)");
            }
            if (e instanceof NodeEvent n && n.getAnchor().isPresent()) {
                throw refuse(e, "the YAML anchor &" + n.getAnchor().get() + " is not allowed in a mixture document;"
                        + " expected a plain value (share a sub-model with definitions and use)");
            }
            Optional<String> tag = e instanceof ScalarEvent s ? s.getTag()
                    : e instanceof CollectionStartEvent c ? c.getTag() : Optional.empty();
            if (tag.isPresent()) {
                throw refuse(e, "the YAML tag " + tag.get() + " is not allowed in a mixture document; expected an"
                        + " untagged value (a value's type is the YAML 1.2 core schema's reading of it; quote a"
                        + " label that looks like a number)");
            }
            return e;
        }

        private StreamReadException refuse(Event e, String problem) {
            Mark m = e.getStartMark().orElse(null);
            FormatException f = new FormatException(file, m == null ? 0 : m.getLine() + 1, m == null ? 0 : m.getColumn() + 1,
                    null, problem);
            return new StreamReadException(this, problem, f);
        }
    }
}
