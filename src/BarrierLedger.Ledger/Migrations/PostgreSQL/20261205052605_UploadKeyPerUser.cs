using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.PostgreSQL
{
    /// <inheritdoc />
    public partial class UploadKeyPerUser : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropIndex(
                name: "IX_Uploads_Key",
                table: "Uploads");

            migrationBuilder.AddColumn<string>(
                name: "ContentSha256",
                table: "Uploads",
                type: "character varying(64)",
                maxLength: 64,
                nullable: true,
                collation: "C");

            migrationBuilder.CreateIndex(
                name: "IX_Uploads_UploaderUserId_Key",
                table: "Uploads",
                columns: new[] { "UploaderUserId", "Key" },
                unique: true);
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropIndex(
                name: "IX_Uploads_UploaderUserId_Key",
                table: "Uploads");

            migrationBuilder.DropColumn(
                name: "ContentSha256",
                table: "Uploads");

            migrationBuilder.CreateIndex(
                name: "IX_Uploads_Key",
                table: "Uploads",
                column: "Key",
                unique: true);
        }
    }
}
