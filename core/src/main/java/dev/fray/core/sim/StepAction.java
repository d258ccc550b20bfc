package dev.fray.core.sim;

/** What a step listener asks the run loop to do next. */
public enum StepAction {
    /** Go on. */
    CONTINUE,
    /** Stop the run after this step; {@link StepListener#finish} is still called. */
    STOP
}
