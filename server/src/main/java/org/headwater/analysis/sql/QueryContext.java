package org.headwater.analysis.sql;

/** What analysing a query needs from around it: known schemas, visible CTEs, the enclosing scope. */
record QueryContext(ScriptCatalog catalog, Warnings warnings, Ctes ctes, Scope outer) {

    QueryContext withOuter(Scope scope) {
        return new QueryContext(catalog, warnings, ctes, scope);
    }

    QueryContext withCtes(Ctes newCtes) {
        return new QueryContext(catalog, warnings, newCtes, outer);
    }
}
