import { describe, expect, it } from "vitest";
import { clockText, parseClockText } from "./clock-text";
import { formatClock } from "./clock";

// 30° of arc per clock hour (geometry): half an hour is 30 minutes, written h:mm as on a clock.
describe("clock positions in a field", () => {
  it("writes hours and minutes as the tables do", () => {
    expect(clockText(2.5)).toBe("2:30");
    expect(clockText(0)).toBe("12:00");
    expect(clockText(11.75)).toBe("11:45");
    // Same digits as the table's formatClock off the hour.
    expect(clockText(2.5)).toBe(formatClock(2.5));
  });
  it("reads h:mm, h.mm and whole hours; refuses the rest", () => {
    expect(parseClockText("2:30")).toBe(2.5);
    expect(parseClockText("2.30")).toBe(2.5);
    expect(parseClockText("12")).toBe(0);
    expect(parseClockText("12:15")).toBe(0.25);
    expect(parseClockText("2.5")).toBeNull();
    expect(parseClockText("13")).toBeNull();
    expect(parseClockText("0")).toBeNull();
    expect(parseClockText("2:75")).toBeNull();
  });
});
