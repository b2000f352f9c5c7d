using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.Sqlite
{
    /// <inheritdoc />
    public partial class CalculationReviewState : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropIndex(
                name: "IX_ReactionStates_SaddleCalculationId",
                table: "ReactionStates");

            migrationBuilder.AddColumn<string>(
                name: "ReviewState",
                table: "Calculations",
                type: "TEXT",
                maxLength: 20,
                nullable: false,
                defaultValue: "AwaitingReview");

            // The stored state of every reviewed calculation from its history: the newest entry's outcome names the state it
            // leads to (Verified, Returned, Reopened); without an entry it stays AwaitingReview. The same SQL on both engines.
            migrationBuilder.Sql(
                """
                UPDATE "Calculations" SET "ReviewState" =
                    (SELECT v."Outcome" FROM "Reviews" AS v WHERE v."CalculationId" = "Calculations"."Id" ORDER BY v."Id" DESC LIMIT 1)
                WHERE EXISTS (SELECT 1 FROM "Reviews" AS v WHERE v."CalculationId" = "Calculations"."Id");
                """);

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStates_SaddleCalculationId_Id",
                table: "ReactionStates",
                columns: new[] { "SaddleCalculationId", "Id" });
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropIndex(
                name: "IX_ReactionStates_SaddleCalculationId_Id",
                table: "ReactionStates");

            migrationBuilder.DropColumn(
                name: "ReviewState",
                table: "Calculations");

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStates_SaddleCalculationId",
                table: "ReactionStates",
                column: "SaddleCalculationId");
        }
    }
}
