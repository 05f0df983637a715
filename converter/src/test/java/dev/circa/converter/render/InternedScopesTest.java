package dev.circa.converter.render;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.circa.converter.normalize.RenormalizerTest;
import dev.circa.engine.CompiledCircuit;
import org.junit.jupiter.api.Test;

class InternedScopesTest {
    @Test
    void internedScopes_sharedScopes_oneIdPerDistinctScope() throws Exception {
        InternedScopes s = InternedScopes.of(CompiledCircuit.compile(RenormalizerTest.discrete(false, 1)));
        // scopes: {alarm}, {valve}, {pump}, {alarm, valve}, {alarm, valve, pump}
        assertEquals(5, s.scopeCount());
        assertEquals(s.scopeOf(6), s.scopeOf(9));
        assertArrayEquals(new int[] {0, 1, 2}, s.variables(s.scopeOf(14)));
    }
}
