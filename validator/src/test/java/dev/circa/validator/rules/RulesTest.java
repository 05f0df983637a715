package dev.circa.validator.rules;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.validator.render.RuleDocs;
import java.lang.reflect.Method;
import java.lang.reflect.Modifier;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;

/** The registry: sorted unique ids, summaries, a doc page and positive and negative tests per rule. */
class RulesTest {
    private static final List<Class<?>> TESTS = List.of(ReferenceRulesTest.class, ParameterRulesTest.class,
            StructureRulesTest.class, NumberRulesTest.class, DocumentRulesTest.class);

    @Test
    void registry_ids_sortedAndUnique() {
        List<String> ids = Rules.ids();
        List<String> sorted = new ArrayList<>(ids);
        sorted.sort(null);
        assertEquals(sorted, ids);
        assertEquals(ids.size(), new HashSet<>(ids).size());
    }

    @Test
    void registry_everyRule_hasSummaryAndIsFinal() {
        for (Rule r : Rules.all()) {
            assertFalse(r.summary().isBlank(), r.id());
            assertFalse(r.summary().endsWith("."), r.id() + ": summary ends with a period");
            assertTrue(Modifier.isFinal(r.getClass().getModifiers()), r.id());
            assertEquals(r.id(), r.getClass().getSimpleName(), "class name states the defect");
            assertNotNull(r.severity());
            assertNotNull(r.guards());
        }
    }

    @Test
    void registry_everyRule_hasDocPage() {
        for (Rule r : Rules.all()) {
            String doc = RuleDocs.section(r.id());
            assertNotNull(doc, "no section ## " + r.id() + " in " + RuleDocs.RESOURCE);
            assertFalse(doc.isBlank(), r.id());
        }
    }

    @Test
    void registry_everyRule_hasPositiveAndNegativeTest() {
        Set<String> names = new HashSet<>();
        for (Class<?> c : TESTS) {
            for (Method m : c.getDeclaredMethods()) {
                if (m.isAnnotationPresent(Test.class)) {
                    names.add(m.getName());
                }
            }
        }
        for (Rule r : Rules.all()) {
            String prefix = Character.toLowerCase(r.id().charAt(0)) + r.id().substring(1) + "_";
            boolean broken = false;
            boolean clean = false;
            for (String n : names) {
                if (n.startsWith(prefix)) {
                    boolean ok = n.endsWith("_clean");
                    clean |= ok;
                    broken |= !ok;
                }
            }
            assertTrue(broken, r.id() + " has no test that breaks it");
            assertTrue(clean, r.id() + " has no test that passes it (name ending _clean)");
        }
    }
}
