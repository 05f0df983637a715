package dev.circa.format.mixture;

import dev.circa.format.SourceLocation;

/**
 * A value of a parameter block as read, with where it was written: a {@code Double}, a
 * {@code String}, a {@code java.util.List<Located>} or a {@code java.util.Map<String, Located>}
 * (in document order). Only the reader uses it.
 */
record Located(Object value, String path, SourceLocation location) {
    boolean isNumber() {
        return value instanceof Double;
    }

    boolean isList() {
        return value instanceof java.util.List<?>;
    }

    boolean isMap() {
        return value instanceof java.util.Map<?, ?>;
    }

    @SuppressWarnings("unchecked")
    java.util.List<Located> list() {
        return (java.util.List<Located>) value;
    }

    @SuppressWarnings("unchecked")
    java.util.Map<String, Located> map() {
        return (java.util.Map<String, Located>) value;
    }

    String describe() {
        if (value instanceof Double) {
            return "a number";
        }
        if (value instanceof String) {
            return "a string";
        }
        if (isList()) {
            return "a list";
        }
        if (isMap()) {
            return "an object";
        }
        return "null";
    }
}
