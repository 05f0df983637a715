package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import org.junit.jupiter.api.Test;

/** Random region generation is bounded by {@code --max-vars} and {@code --max-nodes}, checked before any work. */
class RandomRegionsLimitsTest {
    @Test
    void checkLimits_hundredMillionVariablesOrManyRepeats_refusedNamingMaxNodes() {
        // the two requests that once ran for 50 s to 6.4 GB
        LimitExceededException a = assertThrows(LimitExceededException.class,
                () -> RandomRegions.checkLimits(100_000_000, 2, 1, ReadLimits.DEFAULT, 100_000_000));
        assertEquals(ReadLimits.MAX_NODES, a.option());
        assertTrue(a.getMessage().contains("set by --max-nodes"), a.getMessage());
        LimitExceededException b = assertThrows(LimitExceededException.class,
                () -> RandomRegions.checkLimits(100, 20, 100_000, ReadLimits.DEFAULT));
        assertTrue(b.getMessage().contains("100 variables, depth 20 and 100000 repeats"), b.getMessage());
        // generate checks first: no variable list of that size is needed to be refused
        IllegalArgumentException g = assertThrows(IllegalArgumentException.class,
                () -> RandomRegions.generate(RandomRegions.realVariables(100), 20, 100_000, 0));
        assertTrue(g.getMessage().contains("--max-nodes"), g.getMessage());
        assertDoesNotThrow(() -> RandomRegions.checkLimits(1000, 10, 10, ReadLimits.DEFAULT));
    }

    @Test
    void checkLimits_variablesPastMaxVars_refusedAtAnyDepth_theDefaultItselfAccepted() {
        for (int depth : new int[] {0, 1}) {
            LimitExceededException e = assertThrows(LimitExceededException.class,
                    () -> RandomRegions.checkLimits(100_000_000, depth, 1, ReadLimits.DEFAULT));
            assertEquals(RandomRegions.MAX_VARIABLES, e.option());
            assertTrue(e.getMessage().contains("100000000 variables is more than the limit of 10000000 set by --max-vars"),
                    e.getMessage());
            assertThrows(LimitExceededException.class,
                    () -> RandomRegions.checkLimits(RandomRegions.DEFAULT_MAX_VARIABLES + 1, depth, 1, ReadLimits.DEFAULT));
            assertDoesNotThrow(() -> RandomRegions.checkLimits(RandomRegions.DEFAULT_MAX_VARIABLES, depth, 1,
                    ReadLimits.DEFAULT));
        }
        // a raised --max-vars passes on to generate
        assertEquals(3, RandomRegions.generate(RandomRegions.realVariables(3), 1, 1, 0, ReadLimits.DEFAULT, 3)
                .variables().size());
        assertThrows(IllegalArgumentException.class,
                () -> RandomRegions.generate(RandomRegions.realVariables(3), 1, 1, 0, ReadLimits.DEFAULT, 2));
    }

    @Test
    void maxVariableReferences_boundsEveryGeneratedGraph() {
        for (int n : new int[] {1, 2, 7, 64}) {
            for (int depth : new int[] {0, 1, 3, 9}) {
                for (int repeats : new int[] {1, 3}) {
                    RegionGraph g = RandomRegions.generate(RandomRegions.realVariables(n), depth, repeats, 5);
                    long refs = 0;
                    for (Region r : g.regions()) {
                        refs += r.vars().length;
                    }
                    assertTrue(refs <= RandomRegions.maxVariableReferences(n, depth, repeats),
                            n + " variables, depth " + depth + ", repeats " + repeats + ": " + refs + " references");
                }
            }
        }
    }
}
