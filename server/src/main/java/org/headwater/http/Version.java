package org.headwater.http;

/** Headwater's version, as packaged into the jar's manifest. */
public final class Version {
    private Version() {
    }

    public static String current() {
        String v = Version.class.getPackage().getImplementationVersion();
        return v == null ? "development" : v;
    }
}
