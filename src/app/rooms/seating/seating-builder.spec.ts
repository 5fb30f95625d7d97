// The seating builder's specs live beside its code in shared/seating/; the client test run
// (which looks under src/ only) picks them up through this import.
import '../../../../shared/seating/seating.spec';
