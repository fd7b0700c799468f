package dev.termgate;
public final class Version { public static final String VALUE = "0.1.0"; private Version() {} }
