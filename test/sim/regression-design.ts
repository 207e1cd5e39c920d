// A design for regression tests at two delay corners, with IEEE 1364 min:typ:max delays
// (IEEE 1364-2005 §7.14.1; `iverilog -T min|max` picks the corner; rise and fall per §7.14):
// - buf b1 #(1:2:3): y follows a after 1 ns (min) or 3 ns (max), both edges.
// - not n1 #(1:2:3, 2:3:4): z rises 1 / 3 ns and falls 2 / 4 ns after y changes.
// From min to max every edge of y moves by +2 ns, and every edge of z by +2 (y) +2 (n1) = +4 ns.
// a toggles at 10, 30, 50 and 70 ns; the simulation ends at 90 ns.

export const CORNER_DESIGN = `\`timescale 1ns/1ps
module corners;
  reg a;
  wire y, z;
  buf #(1:2:3) b1 (y, a);
  not #(1:2:3, 2:3:4) n1 (z, y);
  initial begin
    a = 0;
    #10 a = 1;
    #20 a = 0;
    #20 a = 1;
    #20 a = 0;
    #20 $finish;
  end
endmodule
`;
